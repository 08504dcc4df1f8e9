import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { email } from '@shared/schemas/common';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { zodValidator } from '../../../shared/forms/zod-validator';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import { AuthApi } from '../auth-api';

/** Each key of the reset request's API body and the box it is typed in, by its label. */
export const FORGOT_PASSWORD_FIELDS: FormFields = {
  email: { control: 'email', label: 'E-mail' },
};

@Component({
  selector: 'app-forgot-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
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
  private readonly submission = new FormSubmission(this.form, FORGOT_PASSWORD_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;
  /** The server's neutral answer: it never says whether the address has an account. */
  protected readonly sent = signal<string | null>(null);

  protected submit(): void {
    if (!this.submission.ready()) return;
    this.submission.send(this.api.forgot(this.form.getRawValue().email.trim()), ({ message }) => this.sent.set(message));
  }
}
