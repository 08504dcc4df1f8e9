/**
 * Keeps a copy of the page (index.html) on the device for a start with no signal.
 *
 * The page is not one of the app's fixed files: each copy the server sends carries its own CSP
 * nonce, so the service worker keeps the last copy it fetched (ngsw-config.json, data group
 * "page") instead of a copy made at build time. Every navigation through the worker refreshes that
 * copy. The very first visit happens before the worker controls the page, so when it takes control
 * the page is fetched once through it; the next start with no network then finds it.
 */
export function keepPageForOffline(container: ServiceWorkerContainer | undefined = globalThis.navigator?.serviceWorker): void {
  if (!container || container.controller) return;
  container.addEventListener('controllerchange', () => void fetch('/index.html', { credentials: 'same-origin' }).catch(() => undefined), {
    once: true,
  });
}
