import { Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { email } from '@shared/schemas/common';
import { applyServerErrors } from '../../../shared/forms/server-errors';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import { AuthApi } from '../auth-api';

@Component({
  selector: 'app-forgot-password',
  imports: [AuthFrame, MatButtonModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule, RouterLink],
  templateUrl: './forgot-password.html',
  styleUrl: './forgot-password.scss',
})
export class ForgotPassword {
  private readonly api = inject(AuthApi);

  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, zodValidator(email)],
    }),
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  /** The server's neutral answer: it never says whether the address has an account. */
  protected readonly sent = signal<string | null>(null);

  protected submit(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.forgot(this.form.getRawValue().email.trim()).subscribe({
      next: ({ message }) => {
        this.busy.set(false);
        this.sent.set(message);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(applyServerErrors(this.form, err));
      },
    });
  }
}
