// The work board without surprises, on the demo farm in a real browser: a card whose planned hours
// do not fit its window warns and the column counts its planned hours; a finished card gives the
// acres done and left; after publishing, the column says what changed.
import path from 'node:path';
import { formatHours } from '../../shared/figures';
import type { Board } from '../../shared/schemas/board';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig, freeBoardDay, openedDialog } from '../support/browser';

const STORY_MS = 180_000;

describe('Work board without surprises in a real browser', () => {
  let rig: BrowserRig;
  let day = '';
  let farmId = 0;

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: 'Tamarack Ridge Farm' }).orderBy('id', 'desc').first();
    if (!farm) throw new Error('The demo farm is missing: run scripts/prepare-db.ts --reset-demo on the test database');
    farmId = farm.id;
    day = await freeBoardDay(rig);
  });
  afterAll(async () => {
    if (farmId && day) {
      await rig.t.db('work_orders').where({ farm_id: farmId, day }).delete();
      await rig.t.db('assignments').where({ farm_id: farmId, day }).delete();
      await rig.t.db('board_changes').where({ farm_id: farmId, day }).delete();
      await rig.t.db('board_days').where({ farm_id: farmId, day }).delete();
    }
    await rig.close();
  });

  it(
    'when a card cannot fit its window and another job is finished, then the board warns and counts the planned hours, shows the acres done and left, and says what changed since publishing',
    async () => {
      const db = rig.t.db;
      const member = async (email: string) =>
        (
          await db('memberships')
            .join('users', 'users.id', 'memberships.user_id')
            .where({ 'users.email': email, 'memberships.farm_id': farmId })
            .first('memberships.id')
        ).id as number;
      const byName = async (table: string, name: string) =>
        (await db(table).where({ farm_id: farmId, name }).first()) as { id: number; acres: number };
      const tomas = await member(demo('operator', 0).email);
      const ada = await member('ada@tamarack-ridge.example');
      const north = await byName('fields', 'North Section');
      const slough = await byName('fields', 'Slough Quarter');
      const home = await byName('fields', 'Home Quarter');
      const draw = await byName('fields', 'Draw Half');
      const base = { farm_id: farmId, day, state: 'planned' };
      const tractor1 = (await byName('machines', '4WD No. 1')).id;
      const tractor2 = (await byName('machines', '4WD No. 2')).id;
      const harrow = (await byName('implements', '84 ft heavy harrow')).id;
      const drill = (await byName('implements', '60 ft air drill')).id;
      // North Section harrowed in 08:00–10:00 (2 h): far more work than that.
      await db('assignments').insert([
        {
          ...base,
          field_id: north.id,
          operation: 'harrowing',
          operator_id: tomas,
          machine_id: tractor1,
          implement_id: harrow,
          run_order: 1,
          start_min: 480,
          end_min: 600,
          acres_planned: 200,
        },
        {
          ...base,
          field_id: home.id,
          operation: 'seeding',
          operator_id: tomas,
          machine_id: tractor2,
          implement_id: drill,
          run_order: 2,
          start_min: 780,
          acres_planned: 20,
        },
        // Sprayed 14.5 ac short of the whole quarter, and finished.
        {
          ...base,
          field_id: slough.id,
          operation: 'spraying',
          operator_id: ada,
          machine_id: (await byName('machines', 'Sprayer')).id,
          implement_id: (await byName('implements', '120 ft boom')).id,
          run_order: 1,
          acres_planned: slough.acres,
          state: 'finished',
          acres_done: slough.acres - 14.5,
          started_at: new Date(`${day}T13:00:00Z`),
          finished_at: new Date(`${day}T17:00:00Z`),
          hours_worked: 4,
        },
      ]);

      const page = await rig.newPage({ width: 1400, height: 1000 });
      await signIn(page, demo('owner'));
      await page.goto(`/board?date=${day}`);
      await page.getByRole('heading', { level: 1, name: 'Work board' }).waitFor();
      const column = (name: string) => page.locator('section.column').filter({ has: page.getByRole('heading', { level: 2, name }) });
      const api: Board = await page.evaluate(async (d) => (await fetch(`/api/board?date=${d}`)).json(), day);
      const harrowing = api.assignments.find((a) => a.operation === 'harrowing')!;

      // Point 4: the card warns, naming the planned hours and the window, and the column counts the planned hours.
      const card = column('Tomas Reyes').locator('app-assignment-card').filter({ hasText: 'North Section' });
      await card
        .locator('.conflict-soft')
        .filter({ hasText: `Planned ${formatHours(harrowing.planHours)} does not fit 08:00–10:00 (2.0 h)` })
        .waitFor();
      expect(harrowing.planHours).toBeGreaterThan(2);
      expect((await card.locator('.time').innerText()).trim()).toBe('08:00–10:00');
      expect(await card.locator('.planned').innerText()).toContain(formatHours(harrowing.planHours));
      const tomasHours = api.operators.find((o) => o.membershipId === tomas)!.plannedHours;
      expect(tomasHours).toBeCloseTo(
        api.assignments.filter((a) => a.operator.membershipId === tomas).reduce((s, a) => s + a.bookedHours, 0),
        1,
      );
      expect(await column('Tomas Reyes').locator('.hours').innerText()).toContain(`${formatHours(tomasHours)} planned`);
      await card.scrollIntoViewIfNeeded();
      // Element shots go beside the page shots.
      const shots = path.dirname(await screenshot(page, 'board-surprises-1-card-does-not-fit'));
      await column('Tomas Reyes').screenshot({ path: path.join(shots, 'board-surprises-2-column-does-not-fit.png') });

      // Point 5: the finished card gives what was done and what is left.
      const sprayed = column('Ada Lindqvist').locator('app-assignment-card').filter({ hasText: 'Slough Quarter' });
      expect((await sprayed.locator('.left').innerText()).trim()).toBe('14.5 ac of the field');
      expect(await sprayed.locator('.done').innerText()).toContain(' ac of ');
      expect(await sprayed.getByText('To do').count()).toBe(0);
      await sprayed.screenshot({ path: path.join(shots, 'board-surprises-3-finished-card.png') });

      // Publish, then add a card and move one: the column says so.
      // The card that does not fit is a warning: Publish lists it once more before anything is sent.
      await page.getByRole('button', { name: 'Publish work orders' }).click();
      const warned = await openedDialog(page);
      expect(await warned.getByRole('heading').innerText()).toBe('Publish with warnings?');
      expect(await warned.locator('li').allInnerTexts()).toContainEqual(expect.stringMatching(/does not fit/));
      await screenshot(page, 'board-surprises-publish-warnings');
      await warned.getByRole('button', { name: 'Publish anyway' }).click();
      await page.getByRole('status').filter({ hasText: 'Work orders sent to' }).waitFor();
      const seeding = await db('assignments').where({ farm_id: farmId, day, operation: 'seeding' }).first();
      await db('assignments').where({ id: seeding.id }).update({ start_min: 900 });
      await db('assignments').insert({
        ...base,
        field_id: draw.id,
        operation: 'seeding',
        operator_id: tomas,
        machine_id: tractor2,
        implement_id: drill,
        run_order: 3,
        start_min: 1080,
        acres_planned: 20,
      });
      await page.reload();
      await column('Tomas Reyes').getByText('Since publishing: 1 added, 1 moved').waitFor();
      expect(await column('Ada Lindqvist').locator('.changed').count()).toBe(0);
      expect(await seriousViolations(page)).toEqual([]);
      await column('Tomas Reyes')
        .locator('.column-head')
        .screenshot({ path: path.join(shots, 'board-surprises-4-changed-since-publishing.png') });
      await screenshot(page, 'board-surprises-5-board');
    },
    STORY_MS,
  );
});
