// The work board's weather on the demo farm in a real browser: the fake forecast server's windy
// afternoon is stored through the real client (as the background refresh does), and the spraying
// card shows no-go with its reason; the day header shows the hourly strip; an empty day links to
// the next day with work.
import path from 'node:path';
import type { Board } from '../../shared/schemas/board';
import { refreshFarmWeather } from '../../server/weather/weather.service';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig, freeBoardDay } from '../support/browser';

const STORY_MS = 180_000;

describe('Work board weather in a real browser', () => {
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
    'when the windy afternoon is forecast, then the spraying card shows no-go with its reason, the day header the hourly strip, and an empty day links to the next day with work',
    async () => {
      const db = rig.t.db;
      const byName = async (table: string, name: string) => (await db(table).where({ farm_id: farmId, name }).first()) as { id: number };
      const ada = (
        await db('memberships')
          .join('users', 'users.id', 'memberships.user_id')
          .where({ 'users.email': 'ada@tamarack-ridge.example', 'memberships.farm_id': farmId })
          .first('memberships.id')
      ).id as number;
      // Slough Quarter sprayed 10:00–18:00: across the scenario's windy afternoon.
      await db('assignments').insert({
        farm_id: farmId,
        day,
        state: 'planned',
        field_id: (await byName('fields', 'Slough Quarter')).id,
        operation: 'spraying',
        operator_id: ada,
        machine_id: (await byName('machines', 'Sprayer')).id,
        implement_id: (await byName('implements', '120 ft boom')).id,
        run_order: 1,
        start_min: 600,
        end_min: 1080,
        acres_planned: 40,
      });
      // Store the forecast as the background refresh does: the fake's hours start on the test's day.
      rig.t.weather.mode = 'ok';
      rig.t.weather.scenario = 'windy-afternoon';
      rig.t.weather.now = new Date(`${day}T12:00:00Z`);
      await db('weather_points').where({ farm_id: farmId }).update({ last_success_at: null, last_attempt_at: null });
      const refreshed = await refreshFarmWeather(db, farmId, { url: rig.t.weather.url });
      expect(refreshed.failed).toBe(0);
      expect(refreshed.refreshed).toBeGreaterThan(0);

      const page = await rig.newPage({ width: 1400, height: 1000 });
      await signIn(page, demo('owner'));
      await page.goto(`/board?date=${day}`);
      await page.getByRole('heading', { level: 1, name: 'Work board' }).waitFor();
      const api: Board = await page.evaluate(async (d) => (await fetch(`/api/board?date=${d}`)).json(), day);
      const spraying = api.assignments.find((a) => a.operation === 'spraying')!;
      const verdict = api.weather.cards.find((c) => c.assignmentId === spraying.id)!;
      expect(verdict.verdict).toBe('no-go');
      // The scenario's afternoon wind is 30 km/h = 18.6 mph (1 mi = 1.609344 km), over the 10 mph label window
      // (National Pesticide Stewardship Alliance, "Evaluate the Weather").
      expect(verdict.reason).toMatch(/^wind 18\.6 mph at \d\d:00, above the spraying limit of 10.0 mph$/);

      const card = page.locator('app-assignment-card').filter({ hasText: 'Slough Quarter' });
      const weather = card.locator('.weather[data-verdict="no-go"]');
      await weather.waitFor();
      expect((await weather.locator('.verdict-label').innerText()).trim()).toBe('No-go');
      expect((await weather.locator('.reason').innerText()).trim()).toBe(verdict.reason);
      expect(await card.locator('.conflict-soft').innerText()).toContain(
        `Weather no-go for Slough Quarter spraying over 10:00–18:00: ${verdict.reason}`,
      );

      // The day header's strip: a table a screen reader reads, with the windy hours in it.
      const strip = page.locator('app-day-strip');
      await strip.getByRole('table').waitFor();
      expect(await strip.locator('caption').innerText()).toContain('Hourly forecast');
      // Wind figures read to 0.1 (shared/figures.ts): 30 km/h is 18.6 mph, as the card's reason says.
      expect(await strip.locator('tr.wind td').allInnerTexts()).toContain('18.6');
      expect(await seriousViolations(page)).toEqual([]);
      await card.scrollIntoViewIfNeeded();
      const shots = path.dirname(await screenshot(page, 'board-weather-1-no-go-card'));
      await card.screenshot({ path: path.join(shots, 'board-weather-2-card.png') });
      await strip.screenshot({ path: path.join(shots, 'board-weather-3-strip.png') });

      // The day after the test's day is empty: its link goes to the next day with work the board names.
      const next = await page.evaluate(
        async (d) => ((await (await fetch(`/api/board?date=${d}`)).json()) as Board).nextDayWithWork,
        '2030-01-02',
      );
      if (next === null) throw new Error('The demo farm has no day with work after 2030-01-02; the test day should be one');
      await page.goto('/board?date=2030-01-02');
      const link = page.getByRole('link', { name: /^Next day with work: / });
      await link.waitFor();
      await screenshot(page, 'board-weather-4-next-day-with-work');
      await link.click();
      await page.waitForURL((url) => url.searchParams.get('date') === next);
      expect(next <= day).toBe(true);
      expect(await seriousViolations(page)).toEqual([]);
    },
    STORY_MS,
  );
});
