// A weak signal is not no signal: at the far end of a section, one bar lets a request leave and
// then holds it for minutes without failing it. The operator reopens the run sheet there (390×844):
// the app must not wait on the server to say who is signed in, nor for the day. After a short wait
// it opens as the person last signed in on the phone, with the day kept on the phone and said to
// be waiting for the server; when the server's answers come through, they replace the kept copy.
import bcrypt from 'bcryptjs';
import type { Page, Route } from 'playwright-core';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { freeBoardDay, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';
import { rect } from '../support/geo-fixtures';

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
  let farmId = 0;
  let userId = 0;
  let fieldId = 0;
  let machineId = 0;
  let day = '';
  const tag = Math.random().toString(36).slice(2, 8);
  const person = { role: 'operator' as const, name: `Ida Brandt ${tag}`, email: `ida-${tag}@furlong.test`, password: 'one-bar-pw' };

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    ({ id: farmId } = await db('farms').where({ name: DEMO_FARM_NAME }).first('id'));
    day = await freeBoardDay(rig, undefined, { past: true });
    [{ id: userId }] = await db('users')
      .insert({ email: person.email, name: person.name, password_hash: bcrypt.hashSync(person.password, 4) })
      .returning('id');
    const [{ id: membershipId }] = await db('memberships')
      .insert({ farm_id: farmId, user_id: userId, role: 'operator', status: 'active', joined_at: db.fn.now() })
      .returning('id');
    [{ id: fieldId }] = await db('fields')
      .insert({
        farm_id: farmId,
        name: `One Bar Quarter ${tag}`,
        boundary: JSON.stringify(rect(-97.66, 46.8, 0.0075, 0.005)),
        area_m2: 80 * 4046.86,
        acres: 80,
      })
      .returning('id');
    [{ id: machineId }] = await db('machines')
      .insert({ farm_id: farmId, name: `4WD ${tag}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: 2210 })
      .returning('id');
    const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    if (!implement) throw new Error('The demo farm has no harrow: run scripts/prepare-db.ts --reset-demo');
    await db('board_days').insert({ farm_id: farmId, day, version: 1, published_at: db.fn.now() });
    await db('assignments').insert({
      farm_id: farmId,
      day,
      field_id: fieldId,
      operation: 'harrowing',
      operator_id: membershipId,
      machine_id: machineId,
      implement_id: implement.id,
      run_order: 1,
      acres_planned: 80,
    });
  });

  afterAll(async () => {
    const db = rig.t.db;
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await db('fields').where({ farm_id: farmId, id: fieldId }).delete();
    await db('machines').where({ farm_id: farmId, id: machineId }).delete();
    await db('memberships').where({ user_id: userId }).delete();
    await db('users').where({ id: userId }).delete();
    await rig.close();
  });

  it('when the server neither answers nor fails, then the run sheet opens from the phone after the wait, says it waits for the server, and the answers replace it', async () => {
    // No service worker: the driver's routes then see the page's own requests.
    const page = await rig.newPage(undefined, { serviceWorkers: 'block' });
    await signIn(page, person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${day}`);
    await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();
    await page.locator('[data-job]').first().waitFor();
    const online = await jobsShown(page);
    expect(online).toHaveLength(1);
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
