import type { Router } from '@angular/router';

/**
 * Sends the person to sign-in after their session ended, to come back afterwards to the page they
 * were on (not to the bare root, nor to sign-in itself).
 */
export function toSignIn(router: Router): void {
  const current = router.url;
  void router.navigate(['/sign-in'], { queryParams: current === '/' || current.startsWith('/sign-in') ? {} : { next: current } });
}
