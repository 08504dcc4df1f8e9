import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { AuthStore } from '../../../core/auth/auth-store';
import { ROLE_HOME, safeNext } from '../../../core/auth/role-home';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import { FormSubmission } from '../../../shared/forms/form-submission';

@Component({
  selector: 'app-sign-in',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AuthFrame, MatButtonModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule, RouterLink],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
})
export class SignIn {
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);

  /** Where to go after signing in (`?next=`), if it is a path inside Furlong. */
  readonly next = input<string>();

  protected readonly form = new FormGroup({
    email: new FormControl('', {
      nonNullable: true,
      // Kept light (no schema library) so the first page loads fast on a weak connection.
      validators: [Validators.required, Validators.email],
    }),
    password: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;

  protected submit(): void {
    if (!this.submission.ready()) return;
    const { email, password } = this.form.getRawValue();
    this.submission.send(
      this.auth.login(email.trim(), password),
      (me) => void this.router.navigateByUrl(safeNext(this.next()) ?? ROLE_HOME[me.role]),
    );
  }
}
