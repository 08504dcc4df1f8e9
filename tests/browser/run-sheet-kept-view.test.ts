// With no connection, the phone shows the run sheet it last drew the moment the app is opened,
// before the app's own code has started (about a second on a phone): read-only, under a note that
// it is the phone's copy. The app's own run sheet then takes over, and works. On a 390×844 phone,
// as an operator with one job; the browser's CPU is slowed down for the reload, as on a
// low-end phone, so the copy stays on screen long enough to be looked at.
import type { Page } from 'playwright-core';
import { freeBoardDay, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { waitForOfflineReady } from '../support/offline';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };

/**
 * Runs in the page before its own scripts: notes what the copy showed when it came, whether the app
 * had drawn its own run sheet by then, and when the copy went (and whether the app's was drawn then).
 */
const RECORD_COPY = `(() => {
  window.__copy = { seen: null, goneAt: null, appDrawnWhenGone: null };
  new MutationObserver(() => {
    const box = document.getElementById('furlong-kept-view');
    if (box && !window.__copy.seen) {
      const copy = box.querySelector('.kept-view-copy');
      window.__copy.seen = {
        at: performance.now(),
        note: box.querySelector('[data-kept-view-note]')?.textContent ?? null,
        inert: copy?.hasAttribute('inert') ?? false,
        text: copy?.textContent ?? '',
        appDrawn: document.querySelector('app-root h1') !== null,
      };
    }
    if (!box && window.__copy.seen && window.__copy.goneAt === null) {
      window.__copy.goneAt = performance.now();
      window.__copy.appDrawnWhenGone = document.querySelector('app-root h1') !== null;
    }
  }).observe(document, { subtree: true, childList: true });
})();`;

interface CopyRecord {
  seen: { at: number; note: string | null; inert: boolean; text: string; appDrawn: boolean } | null;
  goneAt: number | null;
  appDrawnWhenGone: boolean | null;
}

/** Whether the page now holds the copy or anything it added (its styles, the class on <html>). */
const copyLeftovers = (page: Page) =>
  page.evaluate(() => ({
    box: document.getElementById('furlong-kept-view') !== null,
    styles: document.querySelectorAll('style[data-kept-view]').length,
    hidden: document.documentElement.classList.contains('kept-view-open'),
  }));

describe('The run sheet kept as drawn, in a real browser', () => {
  let rig: BrowserRig;
  let job: PhoneJob;

  beforeAll(async () => {
    rig = await startRig();
    // A day ahead with no other work: the run sheet opened without a day shows it as the next day with work.
    job = await createPhoneJob(rig, { day: await freeBoardDay(rig), name: 'Nils Aberg', corner: [-97.62, 46.84], engineHours: 1480 });
  });

  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  /** The operator's own run sheet opened online on a phone, once the page has kept what it drew (after a second unchanged). */
  async function openKept(): Promise<Page> {
    const page = await rig.newPage();
    await signIn(page, job.person);
    await page.setViewportSize(PHONE);
    await page.goto('/run-sheet');
    await page.getByText(`1. ${job.fieldName} · Harrowing`).waitFor();
    for (const deadline = Date.now() + 15_000; !(await page.evaluate(() => localStorage.getItem('furlong.kept-view') !== null));) {
      if (Date.now() > deadline) throw new Error('the run sheet was not kept as drawn within 15 s');
      await page.waitForTimeout(100);
    }
    return page;
  }

  it('when the operator opens the app with no connection, then the day they last saw shows before the app starts, read-only under its note, and the app takes over', async () => {
    const page = await openKept();
    const title = `1. ${job.fieldName} · Harrowing`;
    await waitForOfflineReady(page);

    await page.context().setOffline(true);
    // The app opened again (a new tab of the same browser: a reload keeps the page's idea that it is online).
    const again = await page.context().newPage();
    await again.setViewportSize(PHONE);
    const blocked: string[] = [];
    again.on('console', (m) => {
      if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) blocked.push(m.text());
    });
    await again.addInitScript(RECORD_COPY);
    const cdp = await page.context().newCDPSession(again);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 6 });
    await again.goto('/run-sheet', { waitUntil: 'commit' });
    // Still slowed down: the copy is on screen while the app starts underneath.
    await again.locator('#furlong-kept-view .kept-view-copy').getByText(title).waitFor({ state: 'attached' });
    await screenshot(again, 'run-sheet-kept-view-copy');
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });

    // The app's own run sheet, from the day kept on the phone, answering taps.
    await again
      .locator('[data-as-of]')
      .getByText(/^No connection: the run sheet kept on this phone, as of \d\d:\d\d\.$/)
      .waitFor({ timeout: 30_000 });
    await again.getByRole('button', { name: title, expanded: true }).click();
    await again.getByRole('button', { name: title, expanded: false }).waitFor();
    await screenshot(again, 'run-sheet-kept-view-app');

    const record = (await again.evaluate('window.__copy')) as CopyRecord;
    expect(record.seen).not.toBeNull();
    // Before the app had drawn its run sheet, the copy showed the day: its job, read-only, said to be the phone's.
    expect(record.seen!.appDrawn).toBe(false);
    expect(record.seen!.text).toContain(title);
    expect(record.seen!.text).toContain('Run sheet');
    expect(record.seen!.inert).toBe(true);
    expect(record.seen!.note).toMatch(/^Opening: the run sheet kept on this phone, as of \d\d:\d\d\.$/);
    // Then it went because the app had drawn its run sheet (not the script's own 15 s fallback), and
    // took its styles and the class hiding the app with it.
    expect(record.goneAt).not.toBeNull();
    expect(record.appDrawnWhenGone).toBe(true);
    expect(record.goneAt! - record.seen!.at).toBeLessThan(15_000);
    expect(await copyLeftovers(again)).toEqual({ box: false, styles: 0, hidden: false });
    // The copy's styles carried this page's nonce; its style attributes were set through the DOM.
    expect(blocked).toEqual([]);
  });

  it('when the connection is there, then the app opens from the server with no copy shown', async () => {
    const page = await openKept();
    await page.addInitScript(RECORD_COPY);
    await page.reload();
    await page.getByText(`1. ${job.fieldName} · Harrowing`).waitFor();
    expect(((await page.evaluate('window.__copy')) as CopyRecord).seen).toBeNull();
    expect(await copyLeftovers(page)).toEqual({ box: false, styles: 0, hidden: false });
  });

  it('the copy on screen passes the accessibility check (axe: no serious or critical violations)', async () => {
    const page = await openKept();
    const title = `1. ${job.fieldName} · Harrowing`;
    // The copy as the page's own script puts it up, held still: the page says it is offline and runs
    // the script again (the app has already drawn its run sheet, so it leaves the copy for its 15 s).
    await page.evaluate(async () => {
      Object.defineProperty(navigator, 'onLine', { configurable: true, get: () => false });
      const script = document.createElement('script');
      script.src = '/kept-view.js';
      await new Promise((resolve, reject) => {
        script.onload = resolve;
        script.onerror = reject;
        document.body.append(script);
      });
    });
    await page.locator('#furlong-kept-view .kept-view-copy').getByText(title).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    expect(await copyLeftovers(page)).toEqual({ box: true, styles: expect.any(Number), hidden: true });
  });
});
