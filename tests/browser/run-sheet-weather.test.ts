// The run sheet's weather on the demo farm in a real browser, on a 390 × 844 phone: the fake
// forecast server's windy afternoon is stored through the real client (as the background refresh
// does), and the operator's job shows the hours of its window with the spraying verdict.
import path from 'node:path';
import { refreshFarmWeather } from '../../server/weather/weather.service';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig, freeBoardDay, openedDialog } from '../support/browser';

const STORY_MS = 180_000;

describe('Run sheet weather on a phone in a real browser', () => {
  let rig: BrowserRig;
  let day = '';
  let farmId = 0;

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: 'Tamarack Ridge Farm' }).orderBy('id', 'desc').first();
    if (!farm) throw new Error('The demo farm is missing: run scripts/prepare-db.ts --reset-demo on the test database');
    farmId = farm.id;
    // May to September: the fake forecast follows the month, and the spraying season is when a windy afternoon is the one reason.
    day = await freeBoardDay(rig, [5, 6, 7, 8, 9]);
  });
  afterAll(async () => {
    if (farmId && day) {
      await rig.t.db('assignments').where({ farm_id: farmId, day }).delete();
      await rig.t.db('board_changes').where({ farm_id: farmId, day }).delete();
      await rig.t.db('board_days').where({ farm_id: farmId, day }).delete();
      // The next refresh of the demo farm's points is due at once: this test's far-future forecast does not stay.
      await rig.t.db('weather_points').where({ farm_id: farmId }).update({ last_success_at: null, last_attempt_at: null });
    }
    await rig.close();
  });

  it(
    'when the windy afternoon is forecast, then the operator’s phone shows the hours of the spraying window with wind, direction, rain, Delta T and the no-go reason',
    async () => {
      const db = rig.t.db;
      const byName = async (table: string, name: string) => (await db(table).where({ farm_id: farmId, name }).first()) as { id: number };
      const account = demo('operator', 0);
      const operator = (
        await db('memberships')
          .join('users', 'users.id', 'memberships.user_id')
          .where({ 'users.email': account.email, 'memberships.farm_id': farmId })
          .first('memberships.id')
      ).id as number;
      // Slough Quarter sprayed 10:00–18:00: across the scenario's windy afternoon.
      await db('assignments').insert({
        farm_id: farmId,
        day,
        state: 'planned',
        field_id: (await byName('fields', 'Slough Quarter')).id,
        operation: 'spraying',
        operator_id: operator,
        machine_id: (await byName('machines', 'Sprayer')).id,
        implement_id: (await byName('implements', '120 ft boom')).id,
        run_order: 1,
        start_min: 600,
        end_min: 1080,
        acres_planned: 40,
      });
      rig.t.weather.mode = 'ok';
      rig.t.weather.scenario = 'windy-afternoon';
      rig.t.weather.now = new Date(`${day}T12:00:00Z`);
      await db('weather_points').where({ farm_id: farmId }).update({ last_success_at: null, last_attempt_at: null });
      const refreshed = await refreshFarmWeather(db, farmId, { url: rig.t.weather.url });
      expect(refreshed.failed).toBe(0);

      const page = await rig.newPage();
      await signIn(page, account);
      await page.setViewportSize({ width: 390, height: 844 });
      // The phone's clock on the job's own morning (as the fake forecast's): Start opens only from the
      // job's day at the farm, and this test reads the Start dialog.
      await page.clock.setFixedTime(new Date(`${day}T15:00:00Z`));
      await page.goto(`/run-sheet?date=${day}`);
      const panel = page.locator('mat-expansion-panel').filter({ hasText: 'Slough Quarter' });
      await panel.waitFor();
      const win = panel.locator('app-hourly-window');
      if (!(await win.isVisible())) await panel.locator('mat-expansion-panel-header').click();
      await win.locator('table').waitFor();
      // 10:00 … 17:00: the window's hours, its end hour not judged.
      expect(await win.locator('thead th[scope=col]').allInnerTexts()).toEqual(
        ['10', '11', '12', '13', '14', '15', '16', '17'].map((h) => `${h}:00`),
      );
      expect(await win.locator('.window-verdict .badge').innerText()).toBe('No-go');
      // The scenario's afternoon wind is 30 km/h = 18.6 mph (1 mi = 1.609344 km), over the 10 mph label window
      // (National Pesticide Stewardship Alliance, "Evaluate the Weather").
      const reason = await win.locator('.window-verdict li').first().innerText();
      expect(reason).toMatch(/^wind 18\.6 mph at \d\d:00, above the spraying limit of 10\.0 mph$/);
      // The strip writes that hour's wind as the server's reason does (shared/figures.ts), not rounded apart.
      const hour = /at (\d\d:00)/.exec(reason)![1];
      const column = (await win.locator('thead th[scope=col]').allInnerTexts()).indexOf(hour);
      const windRow = win.locator('tbody tr').filter({ has: page.locator('th', { hasText: /^Wind$/ }) });
      const windCell = (await windRow.locator('td').nth(column).innerText()).split(/\s+/).slice(0, 2).join(' ');
      expect(windCell).toBe('18.6 mph');
      expect(reason.startsWith(`wind ${windCell} at ${hour}`)).toBe(true);
      expect(await win.locator('tbody th', { hasText: 'Delta T' }).count()).toBe(1);
      expect(await win.locator('.age').innerText()).toMatch(/^Forecast from \d\d:\d\d, \d+ min old$/);
      // The strip scrolls inside itself: the page is no wider than the phone.
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      expect(await seriousViolations(page)).toEqual([]);
      await win.scrollIntoViewIfNeeded();
      const shots = path.dirname(await screenshot(page, 'run-sheet-weather-1-phone'));
      await win.screenshot({ path: path.join(shots, 'run-sheet-weather-2-window.png') });

      // Start says the no-go once more, in the dialog the operator reads before setting off.
      await panel.getByRole('button', { name: 'Start' }).click();
      const dialog = await openedDialog(page);
      expect(await dialog.locator('[data-start-no-go]').innerText()).toContain(reason);
      await screenshot(page, 'run-sheet-weather-3-start-no-go');
      await dialog.getByRole('button', { name: 'Cancel' }).click();
      await dialog.waitFor({ state: 'detached' });
    },
    STORY_MS,
  );
});
