// A browser whose clock is set half a world away from the farm still shows the farm's clock: the
// board's "Last published" and the run sheet's log read in the farm's time zone. The expected
// text is worked out from the stored instant with luxon (IANA zone data), not by the app's code.
import type { Page } from 'playwright-core';
import { DateTime } from 'luxon';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, freeBoardDay, screenshot, signIn, startRig, type BrowserRig } from '../support/browser';

/** Far from any North American farm: 14 to 15 hours ahead of the prairies. */
const BROWSER_ZONE = 'Asia/Tokyo';

describe("Times in the farm's zone, from a browser in another zone", () => {
  let rig: BrowserRig;
  let farmId = 0;
  let farmZone = '';
  let day = '';
  let jobId = 0;
  let operatorId = 0;
  const owner = demo('owner');

  /** A page whose browser believes it is in Tokyo. */
  async function tokyoPage(): Promise<Page> {
    const context = await rig.browser.newContext({
      viewport: { width: 1280, height: 800 },
      baseURL: rig.baseUrl,
      locale: 'en-US',
      timezoneId: BROWSER_ZONE,
    });
    // Closed by the test; the rig closes the browser in any case.
    return context.newPage();
  }

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    const farm = await db('farms').where({ name: DEMO_FARM_NAME }).first('id', 'time_zone');
    farmId = farm.id;
    farmZone = farm.time_zone;
    day = await freeBoardDay(rig);
    const tomas = demo('operator', 0);
    operatorId = (
      await db('memberships as m')
        .join('users as u', 'u.id', 'm.user_id')
        .where({ 'u.email': tomas.email, 'm.farm_id': farmId })
        .first('m.id')
    ).id;
    const field = await db('fields').where({ farm_id: farmId }).orderBy('id').first('id', 'acres');
    const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    const machine = await db('machines').where({ farm_id: farmId, kind: 'tractor-4wd' }).first('id');
    if (!implement || !machine) throw new Error('The demo farm has no harrow or 4WD tractor: run scripts/prepare-db.ts --reset-demo');
    // Published the evening before at the farm, which is already the next morning in Tokyo.
    const published = DateTime.fromISO(`${day}T02:30:00Z`).minus({ days: 1 }).toJSDate();
    await db('board_days').insert({ farm_id: farmId, day, version: 1, published_at: published });
    [{ id: jobId }] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: field.id,
        operation: 'harrowing',
        operator_id: operatorId,
        machine_id: machine.id,
        implement_id: implement.id,
        run_order: 1,
        acres_planned: field.acres,
        state: 'underway',
      })
      .returning('id');
    // Started in the farm's morning: late evening in Tokyo.
    await db('assignment_events').insert({
      farm_id: farmId,
      assignment_id: jobId,
      type: 'start',
      at: new Date(`${day}T13:47:00Z`),
      engine_hours: 2781,
    });
  });
  afterAll(async () => {
    const db = rig.t.db;
    await db('assignment_events').where({ assignment_id: jobId }).delete();
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await rig.close();
  });

  it("when the browser's zone is Tokyo, then the board's Last published and the run-sheet log show the farm's clock", async () => {
    const db = rig.t.db;
    const stored = await db('board_days').where({ farm_id: farmId, day }).first('published_at');
    const event = await db('assignment_events').where({ assignment_id: jobId, type: 'start' }).first('at');
    // Outside reference: luxon with the IANA zone database.
    const publishedText = DateTime.fromJSDate(stored.published_at, { zone: farmZone }).setLocale('en-US').toFormat('LLL d, HH:mm');
    const tokyoText = DateTime.fromJSDate(stored.published_at, { zone: BROWSER_ZONE }).setLocale('en-US').toFormat('LLL d, HH:mm');
    const startedText = DateTime.fromJSDate(event.at, { zone: farmZone }).toFormat('HH:mm');
    // The test means something only if the two zones read the instants differently.
    expect(tokyoText).not.toBe(publishedText);
    expect(DateTime.fromJSDate(event.at, { zone: BROWSER_ZONE }).toFormat('HH:mm')).not.toBe(startedText);

    const page = await tokyoPage();
    expect(await page.evaluate(() => Intl.DateTimeFormat().resolvedOptions().timeZone)).toBe(BROWSER_ZONE);
    await signIn(page, owner);
    await page.goto(`/board?date=${day}`);
    const why = page.locator('#publish-why');
    await why.getByText('Last published').waitFor();
    expect((await why.innerText()).trim()).toBe(`Last published ${publishedText}.`);
    await screenshot(page, 'farm-time-board-last-published-from-tokyo');

    await page.goto(`/run-sheet?date=${day}&person=${operatorId}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: 'Harrowing' });
    const firstLine = panel.locator('.log li').first();
    await firstLine.waitFor();
    expect(await firstLine.locator('.time').innerText()).toBe(startedText);
    // The page scrolls inside the app's frame: bring the log into the shot.
    await firstLine.scrollIntoViewIfNeeded();
    await screenshot(page, 'farm-time-run-sheet-log-from-tokyo');
    await page.context().close();
  });
});
