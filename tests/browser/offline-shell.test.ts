// A phone that opened Furlong once opens it again with no network: the service worker serves the
// app shell, its lazy chunks, fonts and icons and the page itself (the built files read straight
// from its caches), and nothing is asked of any server. On a 390×844 phone, as the operator.
import type { Page } from 'playwright-core';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { waitForOfflineReady } from '../support/offline';

const PHONE = { width: 390, height: 844 };

describe('The app with no network, in a real browser', () => {
  let rig: BrowserRig;

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(async () => {
    await rig.close();
  });

  it('when the operator opened the run sheet once and the phone loses its signal, then a reload still shows the shell and the run sheet, styled, with its fonts, and nothing leaves the device', async () => {
    const page: Page = await rig.newPage();
    await signIn(page, demo('operator'));
    await page.setViewportSize(PHONE);
    await page.goto('/run-sheet');
    await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();
    const ready = await waitForOfflineReady(page);
    // The shell and every lazy chunk (the run sheet's among them) are fetched when the worker installs.
    expect(ready.prefetched.filter((p) => /^\/chunk-[A-Z0-9]+\.js$/.test(p)).length).toBeGreaterThan(5);
    expect(ready.prefetched.some((p) => /^\/media\/roboto-latin-400-normal-[A-Z0-9]+\.woff2$/.test(p))).toBe(true);
    expect(ready.prefetched.some((p) => /^\/media\/material-symbols-outlined-latin-400-normal-[A-Z0-9]+\.woff2$/.test(p))).toBe(true);

    await page.context().setOffline(true);
    // The worker's own fetches are offline too (not only the page's): an API call through it fails.
    const health = await page.evaluate(async () =>
      fetch('/api/health').then(
        (r) => `status ${r.status}`,
        () => 'failed',
      ),
    );
    expect(['failed', 'status 504']).toContain(health);

    const blocked: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) blocked.push(m.text());
    });
    const fromNetwork: string[] = [];
    page.on('response', (r) => {
      if (!r.fromServiceWorker()) fromNetwork.push(r.url());
    });
    const outsideBefore = rig.outside.length;

    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();
    // The shell: the app's own header and navigation. The run sheet opens only for a signed-in
    // operator or owner: with no server to ask, that is the person this device last saw.
    await page.getByRole('banner').waitFor();
    await page.getByRole('button', { name: 'Open navigation' }).waitFor();
    // The day read while online was kept on the device: it shows, said to be the phone's copy.
    await page
      .locator('[data-as-of]')
      .getByText(/No connection: the run sheet kept on this phone, as of \d\d:\d\d\./)
      .waitFor();
    await page.evaluate(async () => document.fonts.ready);
    const fonts = await page.evaluate(() => ({
      text: document.fonts.check('16px Roboto'),
      icons: document.fonts.check('24px "Material Symbols Outlined"'),
    }));
    expect(fonts).toEqual({ text: true, icons: true });
    // The page kept by the worker carries the nonce of its own policy: component styles apply.
    expect(blocked).toEqual([]);
    const headingFont = await page.getByRole('heading', { level: 1, name: 'Run sheet' }).evaluate((el) => getComputedStyle(el).fontFamily);
    expect(headingFont).toMatch(/Roboto/);

    // The built files came straight from the worker's caches, without starting the worker for
    // each (the Static Routing API: Resource Timing's workerFinalSourceType says where each came from).
    const sources = await page.evaluate(() =>
      performance
        .getEntriesByType('resource')
        .map((e) => e as PerformanceResourceTiming & { workerFinalSourceType?: string })
        .filter((e) => /\/(chunk|main)-[A-Z0-9]+\.js$|\/styles-[A-Z0-9]+\.css$/.test(new URL(e.name).pathname))
        .map((e) => e.workerFinalSourceType),
    );
    expect(sources.length).toBeGreaterThan(5);
    expect(new Set(sources)).toEqual(new Set(['cache']));
    expect(fromNetwork).toEqual([]);
    expect(rig.outside.slice(outsideBefore)).toEqual([]);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'offline-shell-run-sheet');
    await page.context().setOffline(false);
  });
});
