import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { TokenInfo } from '@shared/schemas/auth';
import { AuthStore } from '../../../core/auth/auth-store';
import { ROLE_HOME } from '../../../core/auth/role-home';
import { applyServerErrors } from '../../../shared/forms/server-errors';
import { AuthFrame } from '../../../shared/ui/auth-frame/auth-frame';
import { AuthApi, tokenInfoUrl } from '../auth-api';
import { passwordPair } from '../password-rules';
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
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected submit(): void {
    const token = this.token();
    if (this.busy() || !token || !this.link.hasValue()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.api.setPassword({ token, password: this.form.getRawValue().passwords.password }).subscribe({
      next: (me) => {
        this.busy.set(false);
        this.auth.signedInAs(me);
        void this.router.navigateByUrl(ROLE_HOME[me.role]);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(applyServerErrors(this.form, err, { password: 'passwords.password' }));
      },
    });
  }
}
