import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterOutlet } from '@angular/router';
import { AuthStore } from './core/auth/auth-store';
import { ThemeStore } from './core/layout/theme';

@Component({
  selector: 'app-root',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterOutlet, MatButtonModule],
  templateUrl: './app.html',
  styleUrl: './app.scss',
})
export class App {
  // Created at start so the remembered theme applies on every page, signed in or not.
  protected readonly theme = inject(ThemeStore);
  protected readonly auth = inject(AuthStore);

  /** Opens the page asked for again, now that the server may answer. */
  protected tryAgain(): void {
    window.location.assign(this.auth.retryUrl ?? window.location.href);
  }
}
