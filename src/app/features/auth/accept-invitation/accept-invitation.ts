import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { TokenInfo } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { ROLE_HOME } from '../../../core/auth/role-home';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import { AuthApi, tokenInfoUrl } from '../auth-api';
import { SET_PASSWORD_FIELDS, passwordPair } from '../password-rules';
import { linkProblem } from '../token-problem';
import { requiredText } from '../../../shared/forms/required-text';

@Component({
  selector: 'app-accept-invitation',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AuthFrame, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, ReactiveFormsModule, RouterLink],
  templateUrl: './accept-invitation.html',
  styleUrl: './accept-invitation.scss',
})
export class AcceptInvitation {
  private readonly api = inject(AuthApi);
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);

  /** From the e-mailed link: `/accept-invitation?token=…`. */
  readonly token = input<string>();

  protected readonly invitation = httpResource<TokenInfo>(() => {
    const token = this.token();
    return token ? tokenInfoUrl(token) : undefined;
  });
  protected readonly problem = computed(() => (this.token() ? linkProblem(this.invitation.error()) : linkProblem('missing')));

  protected readonly form = new FormGroup({
    name: new FormControl('', {
      nonNullable: true,
      validators: [requiredText, Validators.maxLength(120)],
    }),
    passwords: passwordPair(),
  });
  private readonly submission = new FormSubmission(this.form, SET_PASSWORD_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  constructor() {
    effect(() => {
      const info = this.invitation.hasValue() ? this.invitation.value() : undefined;
      const name = this.form.controls.name;
      if (info && name.pristine && !name.value) name.setValue(info.name);
    });
  }

  protected submit(): void {
    const token = this.token();
    const info = this.invitation.hasValue() ? this.invitation.value() : undefined;
    if (this.busy() || !token || !info) return;
    if (!this.submission.ready()) return;
    const { name, passwords } = this.form.getRawValue();
    this.submission.send(
      this.api.setPassword({
        token,
        password: passwords.password,
        ...(info.kind === 'invite' ? { name: name.trim() } : {}),
      }),
      (me) => {
        this.auth.signedInAs(me);
        void this.router.navigateByUrl(ROLE_HOME[me.role]);
      },
    );
  }
}
