import type { Locator, Page } from 'playwright-core';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig, freeBoardDay, openedDialog } from '../support/browser';

const PHONE = { width: 390, height: 844 };
/** Each story drives many screens and two axe runs; the machine may be shared with other suites. */
const STORY_MS = 180_000;

async function pick(page: Page, root: Locator, label: string, option: string | RegExp): Promise<void> {
  await root.getByRole('combobox', { name: label }).click();
  await page.getByRole('option', { name: option }).click();
}

/** Drags with the mouse the way a person does: press, several small moves (CDK waits for them), release. */
async function drag(page: Page, handle: Locator, target: Locator): Promise<void> {
  const from = await handle.boundingBox();
  const to = await target.boundingBox();
  if (!from || !to) throw new Error('nothing to drag, or nowhere to drop');
  const start = { x: from.x + from.width / 2, y: from.y + from.height / 2 };
  const end = { x: to.x + to.width / 2, y: to.y + Math.min(40, to.height / 2) };
  await page.mouse.move(start.x, start.y);
  await page.mouse.down();
  await page.mouse.move(start.x + 8, start.y + 8, { steps: 4 });
  await page.mouse.move(end.x, end.y, { steps: 25 });
  await page.mouse.move(end.x + 2, end.y + 2, { steps: 3 });
  await page.mouse.up();
}

/** The shell scrolls inside its content pane, so a full-page shot needs a viewport as tall as that pane's content. */
async function tallScreenshot(page: Page, name: string, viewport: { width: number; height: number }): Promise<void> {
  const content = await page.evaluate(() => document.querySelector('.mat-drawer-content')?.scrollHeight ?? 0);
  await page.setViewportSize({ width: viewport.width, height: Math.max(viewport.height, Math.min(6000, content + 80)) });
  await screenshot(page, name);
  await page.setViewportSize(viewport);
}

describe('Work board and run sheet in a real browser', () => {
  let rig: BrowserRig;
  let day = '';
  let farmId = 0;
  /** The seeding job the owner's story puts on Tomas's day; the phone story finishes it. */
  let seedingId = 0;
  const tomas = demo('operator', 0);
  const milo = demo('operator', 2);

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: 'Tamarack Ridge Farm' }).orderBy('id', 'desc').first();
    const fleet = farm ? await rig.t.db('machines').where({ farm_id: farm.id }).first() : null;
    if (!fleet) throw new Error('The demo farm has no fleet: run scripts/prepare-db.ts --reset-demo on the test database');
    farmId = farm.id;
    // A day gone by: Tomas starts his job on it now, and a start waits for the job's day.
    day = await freeBoardDay(rig, undefined, { past: true });
  });
  afterAll(async () => {
    // The day was this test's own: take its jobs off the demo farm so other screens'
    // tests (the season's "newest worked season") see only the demo's history.
    const farm = await rig.t.db('farms').where({ name: 'Tamarack Ridge Farm' }).orderBy('id', 'desc').first();
    if (farm && day) {
      await rig.t.db('work_orders').where({ farm_id: farm.id, day }).delete();
      await rig.t.db('assignments').where({ farm_id: farm.id, day }).delete();
      await rig.t.db('board_changes').where({ farm_id: farm.id, day }).delete();
      await rig.t.db('board_days').where({ farm_id: farm.id, day }).delete();
    }
    await rig.close();
  });

  it(
    'when the owner builds a day, fixes the learner conflict, drags a card and publishes, then the operators are mailed their orders',
    async () => {
      const page = await rig.newPage();
      await signIn(page, demo('owner'));
      await page.goto(`/board?date=${day}`);
      await page.getByRole('heading', { level: 1, name: 'Work board' }).waitFor();
      const column = (name: string) => page.locator('section.column').filter({ has: page.getByRole('heading', { level: 2, name }) });
      await column('Milo Sorensen').waitFor();
      expect(await page.locator('app-assignment-card').count()).toBe(0);

      // Milo harrows North Section with the heavy harrow: a learner on his own.
      await page.getByRole('button', { name: 'Add a card for Milo Sorensen' }).click();
      let dialog = await openedDialog(page);
      await dialog.getByRole('heading', { name: 'New card' }).waitFor();
      await pick(page, dialog, 'Field', /^North Section ·/);
      await pick(page, dialog, 'Operation', 'Harrowing');
      await pick(page, dialog, 'Implement', '84 ft heavy harrow');
      await pick(page, dialog, 'Machine', '4WD No. 1');
      await dialog.getByText('Milo Sorensen is learning harrowing').waitFor();
      await dialog.getByRole('button', { name: 'Save card' }).click();
      await dialog.waitFor({ state: 'detached' });

      const miloCard = column('Milo Sorensen').locator('app-assignment-card').filter({ hasText: 'North Section' });
      await miloCard.locator('.conflict-hard').filter({ hasText: 'has no mentor' }).waitFor();
      expect(await page.getByRole('button', { name: 'Publish work orders' }).isDisabled()).toBe(true);
      await page.getByText('Publishing waits until the hard conflict is fixed').waitFor();
      await screenshot(page, 'board-1-learner-without-mentor');

      // Fix it: Tomas mentors him.
      await page.getByRole('button', { name: 'Edit North Section harrowing' }).click();
      dialog = await openedDialog(page);
      await pick(page, dialog, 'Mentor', 'Tomas Reyes');
      await dialog.getByRole('button', { name: 'Save card' }).click();
      await dialog.waitFor({ state: 'detached' });
      await miloCard.getByText('Tomas Reyes').waitFor();
      expect(await miloCard.locator('.conflict-hard').count()).toBe(0);

      // Seeding on the same field, first put on Ada's day…
      await page.getByRole('button', { name: 'Add a card for Ada Lindqvist' }).click();
      dialog = await openedDialog(page);
      await pick(page, dialog, 'Field', /^North Section ·/);
      await pick(page, dialog, 'Operation', 'Seeding');
      await pick(page, dialog, 'Implement', '60 ft air drill');
      await pick(page, dialog, 'Machine', '4WD No. 2');
      await dialog.getByLabel('Acres planned').fill('100');
      await dialog.getByLabel('Note to the operator').fill('Check the seed depth after the first round');
      await dialog.getByRole('button', { name: 'Save card' }).click();
      await dialog.waitFor({ state: 'detached' });
      const seeding = column('Ada Lindqvist').locator('app-assignment-card').filter({ hasText: 'Seeding' });
      await seeding.waitFor();

      // …then dragged to Tomas, who mentors Milo on the same field.
      const ordered = page.waitForResponse((r) => r.url().includes(`/api/board/${day}/order`) && r.request().method() === 'POST');
      await drag(page, seeding.locator('.drag-handle'), column('Tomas Reyes').locator('.cards'));
      expect((await ordered).status()).toBe(200);
      await column('Tomas Reyes').locator('app-assignment-card').filter({ hasText: 'Seeding' }).waitFor();
      expect(await column('Ada Lindqvist').locator('app-assignment-card').count()).toBe(0);
      // This farm's day only: other files' stories may share the database (and, by chance, a day).
      const saved = await rig.t.db('assignments').where({ farm_id: farmId, day, operation: 'seeding' });
      expect(saved).toHaveLength(1);
      seedingId = saved[0].id;
      const tomasMembership = await rig.t
        .db('memberships')
        .join('users', 'users.id', 'memberships.user_id')
        .where({ 'users.email': tomas.email, 'memberships.farm_id': farmId })
        .first('memberships.id');
      expect(saved[0].operator_id).toBe(tomasMembership.id);

      expect(await page.locator('.conflict-hard').count()).toBe(0);
      const publish = page.getByRole('button', { name: 'Publish work orders' });
      expect(await publish.isEnabled()).toBe(true);
      expect(await seriousViolations(page)).toEqual([]);
      await screenshot(page, 'board-2-ready-light');
      await page.emulateMedia({ colorScheme: 'dark' });
      await screenshot(page, 'board-3-ready-dark');
      expect(await seriousViolations(page)).toEqual([]);
      await page.emulateMedia({ colorScheme: 'light' });

      // Warnings standing on the day (soft conflicts, weather) are listed once more and confirmed.
      await publish.click();
      const anyway = page.getByRole('dialog', { name: 'Publish with warnings?' }).getByRole('button', { name: 'Publish anyway' });
      const sent = page.getByRole('status').filter({ hasText: 'Work orders sent to' });
      await anyway.or(sent).first().waitFor();
      if (await anyway.isVisible()) await anyway.click();
      await sent.waitFor();
      expect(await page.getByRole('status').innerText()).toContain('Tomas Reyes');
      await rig.t.flushMail();
      // Other files' boards (other days) may have left orders queued in the same database: this
      // day's order links to this day's run sheet.
      const order = await rig.t.mail.waitFor((m) => m.to.includes(tomas.email) && m.text.includes(`run-sheet?date=${day}`));
      expect(order.text).toContain('Check the seed depth after the first round');
      await rig.t.mail.waitFor((m) => m.to.includes(milo.email) && m.text.includes(`run-sheet?date=${day}`));

      await page.reload();
      await column('Tomas Reyes')
        .getByText(/Work order (sent|queued)/)
        .waitFor();
      await screenshot(page, 'board-4-published');
    },
    STORY_MS,
  );

  it(
    'when Tomas opens his run sheet on a phone, then he sees the cautions and starts and finishes his job with acres and engine hours',
    async () => {
      const page = await rig.newPage();
      await signIn(page, tomas);
      await page.setViewportSize(PHONE);
      await page.goto(`/run-sheet?date=${day}`);
      await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();

      const panel = page.locator('mat-expansion-panel').filter({ hasText: 'North Section · Seeding' });
      await panel.getByRole('button', { name: 'Start' }).waitFor();
      expect(await page.locator('mat-expansion-panel').filter({ hasText: 'mentoring Milo Sorensen' }).count()).toBe(1);
      await panel.getByText('Check the seed depth after the first round').waitFor();
      await panel.getByText("Furlong's plans are aids: the operator's judgement on the ground comes first.").first().waitFor();
      expect(await panel.locator('.cautions li').count()).toBeGreaterThan(3);
      await panel.locator('app-field-map .leaflet-container').waitFor();

      const start = panel.getByRole('button', { name: 'Start' });
      const box = await start.boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(48);
      expect(box!.width).toBeGreaterThan(PHONE.width * 0.75);
      expect(await seriousViolations(page)).toEqual([]);
      await tallScreenshot(page, 'run-sheet-1-phone-light', PHONE);

      await start.click();
      let dialog = await openedDialog(page);
      const meter = dialog.getByLabel('Engine hours at the start');
      const startHours = Number(await meter.inputValue());
      expect(startHours).toBeGreaterThan(0);
      await dialog.getByRole('button', { name: 'Start' }).click();
      await dialog.waitFor({ state: 'detached' });
      await panel.locator('.log-actions .state').filter({ hasText: 'underway' }).waitFor();
      expect(await panel.getByRole('button', { name: 'Start' }).count()).toBe(0);

      await panel.getByRole('button', { name: 'Report a problem' }).click();
      dialog = await openedDialog(page);
      await dialog.getByRole('radio', { name: 'Something else' }).check();
      await dialog.getByLabel('What happened').fill('East approach gate left open');
      await dialog.getByRole('button', { name: 'Send report' }).click();
      await dialog.waitFor({ state: 'detached' });
      await panel.locator('.log').getByText('East approach gate left open').waitFor();

      await panel.getByRole('button', { name: 'Finish' }).click();
      dialog = await openedDialog(page);
      expect(await dialog.getByLabel('Acres done').inputValue()).toBe('100');
      await dialog.getByLabel('Acres done').fill('96.5');
      await dialog.getByLabel('Engine hours at the end').fill(String(startHours + 4.5));
      await dialog.getByRole('button', { name: 'Finish' }).click();
      await dialog.waitFor({ state: 'detached' });
      await panel.locator('.log-actions .state').filter({ hasText: 'finished' }).waitFor();
      expect(await panel.locator('.buttons button').count()).toBe(0);
      await panel.locator('.log').getByText('Started').waitFor();
      await panel
        .locator('.log')
        .getByText(/Finished · 96\.5 ac/)
        .waitFor();

      const row = await rig.t.db('assignments').where({ id: seedingId }).first();
      const finish = await rig.t.db('assignment_events').where({ assignment_id: seedingId, type: 'finish' });
      // The finish as logged and as the job keeps it: what was typed, no more and no less.
      expect(finish.map((e) => Number(e.acres))).toEqual([96.5]);
      expect(row.state).toBe('finished');
      expect(Number(row.acres_done)).toBeCloseTo(96.5, 2);
      expect(Number(row.engine_hours_end)).toBeCloseTo(startHours + 4.5, 1);

      expect(await seriousViolations(page)).toEqual([]);
      await tallScreenshot(page, 'run-sheet-2-phone-finished-light', PHONE);
      await page.emulateMedia({ colorScheme: 'dark' });
      expect(await seriousViolations(page)).toEqual([]);
      await tallScreenshot(page, 'run-sheet-3-phone-finished-dark', PHONE);
    },
    STORY_MS,
  );

  it('when every page above loaded, then no request left 127.0.0.1', () => {
    expect(rig.outside).toEqual([]);
  });
});
