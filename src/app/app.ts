import { ChangeDetectionStrategy, Component, effect, inject } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { NavigationEnd, Router, RouterOutlet } from '@angular/router';
import { filter } from 'rxjs';
import { AuthStore } from './core/auth/auth-store';
import { ThemeStore } from './core/layout/theme';
import { closeKeptView } from './core/offline/kept-view';

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

  constructor() {
    // The run sheet the phone showed before the app started (core/offline/kept-view) gives way to
    // any other page: sign-in, another address, or the notice that the server cannot say who this is.
    inject(Router)
      .events.pipe(
        filter((e): e is NavigationEnd => e instanceof NavigationEnd && !e.urlAfterRedirects.startsWith('/run-sheet')),
        takeUntilDestroyed(),
      )
      .subscribe(() => closeKeptView());
    effect(() => {
      if (this.auth.unavailable()) closeKeptView();
    });
  }

  /** Opens the page asked for again, now that the server may answer. */
  protected tryAgain(): void {
    window.location.assign(this.auth.retryUrl ?? window.location.href);
  }
}
