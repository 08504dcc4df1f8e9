import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, computed, inject, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { AuthStore } from '../../auth/auth-store';
import { OutboxStore } from '../../../features/run-sheet/outbox-store';
import { navItemsFor } from '../nav-items';
import { ReportsBell } from '../reports-bell/reports-bell';
import { ThemeStore } from '../theme';

/** Below this width the navigation slides over the page behind a menu button. */
export const HANDSET_QUERY = '(max-width: 959.98px)';

@Component({
  selector: 'app-shell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatSidenavModule,
    MatToolbarModule,
    ReportsBell,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);
  protected readonly theme = inject(ThemeStore);
  private readonly outbox = inject(OutboxStore);
  private readonly sidenav = viewChild.required(MatSidenav);

  protected readonly handset = toSignal(
    inject(BreakpointObserver)
      .observe(HANDSET_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly user = this.auth.user;
  protected readonly farm = this.auth.farm;
  protected readonly role = this.auth.role;
  protected readonly isOwner = this.auth.isOwner;
  protected readonly navItems = computed(() => navItemsFor(this.auth.role()));
  protected readonly themeLabel = computed(() => (this.theme.isDark() ? 'Switch to light theme' : 'Switch to dark theme'));

  protected closeOnHandset(): void {
    if (this.handset()) void this.sidenav().close();
  }

  protected signOut(): void {
    // Run-sheet actions not yet sent stay on this phone for the same person, but say so first.
    const waiting = this.outbox.entries().length;
    if (waiting && !window.confirm(unsentWarning(waiting))) return;
    this.auth.logout().subscribe(() => void this.router.navigateByUrl('/sign-in'));
  }
}

/** The question before signing out with run-sheet actions still on the phone. */
export const unsentWarning = (n: number): string =>
  `${n === 1 ? '1 run-sheet action is' : `${n} run-sheet actions are`} not sent yet. ${n === 1 ? 'It stays' : 'They stay'} on this phone and ${n === 1 ? 'is' : 'are'} sent when you sign in here again. Sign out anyway?`;
