import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { FormGroup, ReactiveFormsModule } from '@angular/forms';
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

/** The page a password-reset e-mail links to: `/set-password?token=…`. */
@Component({
  selector: 'app-set-password',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AuthFrame, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, ReactiveFormsModule, RouterLink],
  templateUrl: './set-password.html',
  styleUrl: './set-password.scss',
})
export class SetPassword {
  private readonly api = inject(AuthApi);
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);

  readonly token = input<string>();

  protected readonly link = httpResource<TokenInfo>(() => {
    const token = this.token();
    return token ? tokenInfoUrl(token) : undefined;
  });
  protected readonly problem = computed(() => (this.token() ? linkProblem(this.link.error()) : linkProblem('missing')));

  protected readonly form = new FormGroup({ passwords: passwordPair() });
  private readonly submission = new FormSubmission(this.form, SET_PASSWORD_FIELDS);
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected submit(): void {
    const token = this.token();
    if (this.busy() || !token || !this.link.hasValue()) return;
    if (!this.submission.ready()) return;
    this.submission.send(this.api.setPassword({ token, password: this.form.getRawValue().passwords.password }), (me) => {
      this.auth.signedInAs(me);
      void this.router.navigateByUrl(ROLE_HOME[me.role]);
    });
  }
}
