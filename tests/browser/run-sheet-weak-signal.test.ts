// A weak signal is not no signal: at the far end of a section, one bar lets a request leave and
// then holds it for minutes without failing it. The operator reopens the run sheet there (390×844):
// the app must not wait on the server to say who is signed in, nor for the day. After a short wait
// it opens as the person last signed in on the phone, with the day kept on the phone and said to
// be waiting for the server; when the server's answers come through, they replace the kept copy.
import type { Page, Route } from 'playwright-core';
import { freeBoardDay, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };

/** The jobs on the run sheet, by id, in the order shown. */
const jobsShown = (page: Page) => page.locator('[data-job]').evaluateAll((els) => els.map((e) => e.getAttribute('data-job')));

/** Days kept on the phone (the run sheet's IndexedDB store), read with the browser's own API. */
const keptDays = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<number>((resolve, reject) => {
        const open = indexedDB.open('furlong-outbox');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('sheets')) return resolve(0);
          const count = db.transaction('sheets').objectStore('sheets').count();
          count.onsuccess = () => {
            resolve(count.result);
            db.close();
          };
          count.onerror = () => reject(count.error);
        };
      }),
  );

describe('The run sheet on a weak signal, in a real browser', () => {
  let rig: BrowserRig;
  let job: PhoneJob;

  beforeAll(async () => {
    rig = await startRig();
    job = await createPhoneJob(rig, {
      day: await freeBoardDay(rig, undefined, { past: true }),
      name: 'Ida Brandt',
      corner: [-97.66, 46.8],
      engineHours: 2210,
    });
  });

  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  it('when the server neither answers nor fails, then the run sheet opens from the phone after the wait, says it waits for the server, and the answers replace it', async () => {
    // No service worker: the driver's routes then see the page's own requests.
    const page = await rig.newPage(undefined, { serviceWorkers: 'block' });
    await signIn(page, job.person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${job.day}`);
    await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();
    await page.locator('[data-job]').first().waitFor();
    const online = await jobsShown(page);
    expect(online).toEqual([String(job.jobId)]);
    for (const deadline = Date.now() + 10_000; (await keptDays(page)) === 0; await page.waitForTimeout(100))
      if (Date.now() > deadline) throw new Error('the day was not kept on the phone within 10 s');

    // From here the server gets each request but its answer is held back: nothing fails.
    const held: Route[] = [];
    await page.route(/\/api\/(auth\/me|run-sheet)/, (route) => void held.push(route));
    const started = Date.now();
    await page.reload({ waitUntil: 'commit' });
    await page
      .locator('[data-as-of]')
      .getByText(/^Waiting for the server: the run sheet kept on this phone, as of \d\d:\d\d\.$/)
      .waitFor({ timeout: 20_000 });
    const waited = Date.now() - started;
    expect(await jobsShown(page)).toEqual(online);
    expect(await page.getByRole('heading', { level: 1, name: 'Run sheet' }).isVisible()).toBe(true);
    // Nothing was answered: who is signed in and the day came from the phone.
    expect(held.map((r) => new URL(r.request().url()).pathname)).toEqual(expect.arrayContaining(['/api/auth/me', '/api/run-sheet']));
    // The wait is the app's (SERVER_WAIT_MS, 4 s) and not the browser's own network timeout.
    expect(waited).toBeGreaterThanOrEqual(4000);
    expect(waited).toBeLessThan(20_000);
    await screenshot(page, 'run-sheet-weak-signal-kept');

    // The signal comes through: the held requests reach the server and its answers replace the copy.
    for (const route of held.splice(0)) await route.continue();
    await page.unroute(/\/api\/(auth\/me|run-sheet)/);
    await page.locator('[data-as-of]').waitFor({ state: 'detached', timeout: 15_000 });
    expect(await jobsShown(page)).toEqual(online);
    await screenshot(page, 'run-sheet-weak-signal-answered');
  });
});
