// The operator's phone loses its signal in the field: the run sheet is open (390×844), the
// connection drops, the operator starts the job and finishes it with acres and engine hours. The
// dialogs close at once, the sheet says what waits, and when the signal returns the server holds
// exactly one start and one finish with the times they were tapped.
import bcrypt from 'bcryptjs';
import type { Page } from 'playwright-core';
import { farmTime } from '../../shared/farm-time';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { freeBoardDay, screenshot, seriousViolations, signIn, startRig, type BrowserRig, openedDialog } from '../support/browser';
import { rect } from '../support/geo-fixtures';
import { waitForOfflineReady } from '../support/offline';

const PHONE = { width: 390, height: 844 };

/** The actions waiting in the page's outbox (IndexedDB, read with the browser's own API). */
const outboxOf = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<Array<{ type: string; at: string; clientEventId: string; acres?: number; engineHours?: number }>>((resolve, reject) => {
        const open = indexedDB.open('furlong-outbox');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const all = open.result.transaction('actions').objectStore('actions').index('seq').getAll();
          all.onsuccess = () => {
            resolve(all.result.map((e: { body: never }) => e.body));
            open.result.close();
          };
          all.onerror = () => reject(all.error);
        };
      }),
  );

describe('The run sheet with no signal, in a real browser', () => {
  let rig: BrowserRig;
  let farmId = 0;
  let timeZone = '';
  let userId = 0;
  let fieldId = 0;
  let machineId = 0;
  let jobId = 0;
  let secondFieldId = 0;
  let secondJobId = 0;
  let day = '';
  const tag = Math.random().toString(36).slice(2, 8);
  const person = { role: 'operator' as const, name: `Ansel Marr ${tag}`, email: `ansel-${tag}@furlong.test`, password: 'no-signal-pw' };
  const fieldName = `Far Draw ${tag}`;
  const secondFieldName = `Steel Cab Quarter ${tag}`;

  const logOf = async (id = jobId) =>
    (
      await rig.t
        .db('assignment_events')
        .where({ farm_id: farmId, assignment_id: id })
        .orderBy([{ column: 'at' }, { column: 'id' }])
    ).map((e) => ({ type: e.type, at: (e.at as Date).toISOString(), acres: e.acres, engineHours: e.engine_hours }));

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    const farm = await db('farms').where({ name: DEMO_FARM_NAME }).first('id', 'time_zone');
    farmId = farm.id;
    timeZone = farm.time_zone;
    // A day gone by: the operator starts both jobs now, and a start waits for the job's day.
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
        name: fieldName,
        boundary: JSON.stringify(rect(-97.7, 46.8, 0.0075, 0.005)),
        area_m2: 80 * 4046.86,
        acres: 80,
      })
      .returning('id');
    [{ id: machineId }] = await db('machines')
      .insert({ farm_id: farmId, name: `4WD ${tag}`, kind: 'tractor-4wd', power_hp: 400, engine_hours: 3120 })
      .returning('id');
    [{ id: secondFieldId }] = await db('fields')
      .insert({
        farm_id: farmId,
        name: secondFieldName,
        boundary: JSON.stringify(rect(-97.68, 46.8, 0.0075, 0.005)),
        area_m2: 80 * 4046.86,
        acres: 80,
      })
      .returning('id');
    const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    if (!implement) throw new Error('The demo farm has no harrow: run scripts/prepare-db.ts --reset-demo');
    await db('board_days').insert({ farm_id: farmId, day, version: 1, published_at: db.fn.now() });
    [{ id: jobId }] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: fieldId,
        operation: 'harrowing',
        operator_id: membershipId,
        machine_id: machineId,
        implement_id: implement.id,
        run_order: 1,
        acres_planned: 80,
      })
      .returning('id');
    [{ id: secondJobId }] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: secondFieldId,
        operation: 'harrowing',
        operator_id: membershipId,
        machine_id: machineId,
        implement_id: implement.id,
        run_order: 2,
        acres_planned: 80,
      })
      .returning('id');
  });

  afterAll(async () => {
    const db = rig.t.db;
    await db('client_events').where({ farm_id: farmId }).whereIn('assignment_id', [jobId, secondJobId]).delete();
    await db('assignment_events').where({ farm_id: farmId }).whereIn('assignment_id', [jobId, secondJobId]).delete();
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await db('fields').where({ farm_id: farmId }).whereIn('id', [fieldId, secondFieldId]).delete();
    await db('machines').where({ farm_id: farmId, id: machineId }).delete();
    await db('memberships').where({ user_id: userId }).delete();
    await db('users').where({ id: userId }).delete();
    await rig.close();
  });

  it('when the operator starts and finishes a job with no signal, then the dialogs close, the sheet says 2 actions wait, and back online the server holds one start and one finish at the tapped times', async () => {
    const page = await rig.newPage();
    await signIn(page, person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: fieldName });
    await panel.locator('[data-action="start"]').waitFor();

    await page.context().setOffline(true);
    const startTapped = Date.now();
    await panel.locator('[data-action="start"]').click();
    let dialog = await openedDialog(page);
    await dialog.getByLabel('Engine hours at the start').fill('3120.5');
    await dialog.getByRole('button', { name: 'Start' }).click();
    await dialog.waitFor({ state: 'detached' });

    // The job goes on as started (marked as not sent), so Finish is there with no signal.
    const finishTapped = Date.now();
    await panel.locator('[data-action="finish"]').click();
    dialog = await openedDialog(page);
    await dialog.getByLabel('Acres done').fill('76.5');
    await dialog.getByLabel('Engine hours at the end').fill('3128.9');
    await dialog.getByRole('button', { name: 'Finish' }).click();
    await dialog.waitFor({ state: 'detached' });
    const done = Date.now();

    const sync = page.locator('[data-sync]');
    await sync.getByText('Offline — 2 actions waiting').waitFor();
    expect(await panel.locator('.job-sub [data-unsent]').innerText()).toBe('not sent yet');
    expect(await logOf()).toEqual([]);
    const waiting = await outboxOf(page);
    expect(waiting.map((w) => w.type)).toEqual(['start', 'finish']);
    // Each tap's time is the moment its button was pressed (between the test's clock readings around it).
    expect(Date.parse(waiting[0].at)).toBeGreaterThanOrEqual(startTapped - 1000);
    expect(Date.parse(waiting[0].at)).toBeLessThanOrEqual(finishTapped + 1000);
    expect(Date.parse(waiting[1].at)).toBeGreaterThanOrEqual(finishTapped - 1000);
    expect(Date.parse(waiting[1].at)).toBeLessThanOrEqual(done + 1000);
    expect(await seriousViolations(page)).toEqual([]);
    // The sheet scrolls inside the shell: bring the sync line (top of the sheet) into view for the picture.
    await sync.scrollIntoViewIfNeeded();
    await screenshot(page, 'run-sheet-offline-2-waiting');

    await page.context().setOffline(false);
    await sync.getByText(/^All sent \d\d:\d\d$/).waitFor({ timeout: 20_000 });
    const sentAt = (await sync.innerText()).replace(/^\S+\s+/, '').trim();
    // The time on the farm's clock (America/Chicago for the demo farm) at which the outbox emptied.
    expect([farmTime(new Date(Date.now() - 60_000), timeZone, 'clock'), farmTime(new Date(), timeZone, 'clock')]).toContain(
      sentAt.replace('All sent ', ''),
    );
    expect(await logOf()).toEqual([
      { type: 'start', at: waiting[0].at, acres: null, engineHours: 3120.5 },
      { type: 'finish', at: waiting[1].at, acres: 76.5, engineHours: 3128.9 },
    ]);
    const recorded = await rig.t.db('client_events').where({ farm_id: farmId, assignment_id: jobId }).orderBy('id');
    expect(recorded.map((r) => [r.client_event_id, r.outcome])).toEqual([
      [waiting[0].clientEventId, 'applied'],
      [waiting[1].clientEventId, 'applied'],
    ]);
    // The sheet read again: the server's finished job, no mark left.
    await panel.locator('.job-sub .state[data-state="finished"]').waitFor();
    expect(await panel.locator('[data-unsent]').count()).toBe(0);
    expect(await outboxOf(page)).toEqual([]);
    await sync.scrollIntoViewIfNeeded();
    await screenshot(page, 'run-sheet-offline-all-sent');
  });

  it('when the service worker is served (GET /ngsw-worker.js), then a reload with no signal shows the kept sheet, and a tap made offline survives a second reload', async () => {
    const page = await rig.newPage();
    await signIn(page, person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${day}`);
    // The app's own pages answer any unknown address with index.html: the worker must come back as a script.
    const worker = await page.evaluate(async () => {
      const res = await fetch('/ngsw-worker.js');
      return { status: res.status, type: res.headers.get('content-type') ?? '' };
    });
    if (worker.status !== 200 || !/javascript/.test(worker.type))
      throw new Error(
        `The built app does not serve its service worker (GET /ngsw-worker.js answered ${worker.status} ${worker.type}), so a reload with no signal cannot open the app. Build with the service worker to run this step.`,
      );
    // The worker installs, takes the page and keeps the shell before the network may go.
    await waitForOfflineReady(page);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: secondFieldName });
    await panel.waitFor();

    await page.context().setOffline(true);
    await page.reload();
    await page
      .locator('[data-as-of]')
      .getByText(/as of \d\d:\d\d/)
      .waitFor();
    await panel.waitFor();
    // The first job is finished by now, so this one opens by itself.
    await panel.locator('[data-action="start"]').click();
    const dialog = await openedDialog(page);
    await dialog.getByRole('button', { name: 'Start' }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.locator('[data-sync]').getByText('Offline — 1 action waiting').waitFor();
    await screenshot(page, 'run-sheet-offline-reloaded');
    // The page runs Furlong's worker (Angular's, with the outbox's Background Sync), and where the
    // browser has Background Sync the waiting action asked for a sync when the connection returns.
    const sw = (await page.evaluate(`(async () => {
      const reg = await navigator.serviceWorker.ready;
      const controller = navigator.serviceWorker.controller;
      return {
        script: controller ? new URL(controller.scriptURL).pathname : null,
        syncManager: 'SyncManager' in self,
        tags: reg.sync ? await reg.sync.getTags() : null,
      };
    })()`)) as { script: string | null; syncManager: boolean; tags: string[] | null };
    expect(sw.script).toBe('/furlong-sw.js');
    if (sw.syncManager) expect(sw.tags).toEqual(['furlong-outbox']);

    await page.reload();
    await page.locator('[data-sync]').getByText('Offline — 1 action waiting').waitFor();
    expect(await logOf(secondJobId)).toEqual([]);
    await page.context().setOffline(false);
    await page
      .locator('[data-sync]')
      .getByText(/^All sent \d\d:\d\d$/)
      .waitFor({ timeout: 20_000 });
    expect((await logOf(secondJobId)).map((e) => e.type)).toEqual(['start']);
    // Once all is sent, the job shows the server's state (underway, read after the answer), not
    // the planned job of the copy kept before the tap, and no mark of an unsent action.
    await panel.locator('.job-sub .state[data-state="underway"]').waitFor({ timeout: 5_000 });
    expect(await panel.locator('[data-action="start"]').count()).toBe(0);
    expect(await panel.locator('[data-unsent]').count()).toBe(0);
    expect(await page.locator('[data-as-of]').count()).toBe(0);
  });
});
