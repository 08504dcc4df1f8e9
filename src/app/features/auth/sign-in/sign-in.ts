import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { AuthStore } from '../../../core/auth/auth-store';
import { ROLE_HOME, safeNext } from '../../../core/auth/role-home';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';

/** Each key of the sign-in's API body and the box it is typed in, by its label. */
export const SIGN_IN_FIELDS: FormFields = {
  email: { control: 'email', label: 'E-mail' },
  password: { control: 'password', label: 'Password' },
};

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
  private readonly submission = new FormSubmission(this.form, SIGN_IN_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    if (!this.submission.ready()) return;
    const { email, password } = this.form.getRawValue();
    this.submission.send(
      this.auth.login(email.trim(), password),
      (me) => void this.router.navigateByUrl(safeNext(this.next()) ?? ROLE_HOME[me.role]),
    );
  }
}
