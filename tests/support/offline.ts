import type { Page } from 'playwright-core';

/** What the service worker must hold before the network may go: its manifest's prefetched files and the page. */
export interface OfflineReady {
  /** Paths of the files the worker fetched when it installed (ngsw.json, prefetch groups). */
  prefetched: string[];
  /** Paths held in the browser's Cache Storage. */
  cached: string[];
}

/**
 * Waits until the app's service worker is active and controls the page, and Cache Storage holds
 * every file its manifest prefetches plus the page itself (kept by `keepPageForOffline`). Reads the
 * manifest from the server, so call it while online.
 */
export async function waitForOfflineReady(page: Page, timeoutMs = 60_000): Promise<OfflineReady> {
  // The page's code goes as text: this file is also type-checked with the server's settings (the
  // bench imports it), which have no DOM library.
  const state = (await page.evaluate('navigator.serviceWorker.ready.then((r) => (r.active ? r.active.state : "none"))')) as string;
  if (state !== 'activated' && state !== 'activating') throw new Error(`the service worker is ${state}`);
  await page.waitForFunction('navigator.serviceWorker.controller !== null', undefined, { timeout: timeoutMs });
  const manifest = (await page.evaluate('fetch("/ngsw.json?ngsw-cache-bust=test").then((r) => r.json())')) as {
    assetGroups: Array<{ installMode: string; urls: string[] }>;
  };
  const prefetched = manifest.assetGroups.filter((g) => g.installMode === 'prefetch').flatMap((g) => g.urls);
  const wanted = [...prefetched, '/index.html'];
  const cached = async () =>
    (await page.evaluate(`(async () => {
      const paths = [];
      for (const name of await caches.keys()) for (const req of await (await caches.open(name)).keys()) paths.push(new URL(req.url).pathname);
      return paths;
    })()`)) as string[];
  const until = Date.now() + timeoutMs;
  for (;;) {
    const have = await cached();
    const missing = wanted.filter((p) => !have.includes(p));
    if (missing.length === 0) return { prefetched, cached: have };
    if (Date.now() > until)
      throw new Error(`the service worker has not cached ${missing.length} files, e.g. ${missing.slice(0, 3).join(', ')}`);
    await page.waitForTimeout(250);
  }
}
