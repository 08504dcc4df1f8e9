import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig, openedDialog } from '../support/browser';

/**
 * A day long gone that no board has yet, so this test's one job leaves the demo farm's days alone
 * and can be started now (a start waits for the job's day).
 */
async function freeDay(rig: BrowserRig): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const day = `${1950 + Math.floor(Math.random() * 55)}-0${1 + Math.floor(Math.random() * 9)}-1${Math.floor(Math.random() * 9)}`;
    const [jobs, days] = await Promise.all([rig.t.db('assignments').where({ day }).first(), rig.t.db('board_days').where({ day }).first()]);
    if (!jobs && !days) return day;
  }
  throw new Error('no free board day found');
}

describe("The owner logs on someone's run sheet in a real browser", () => {
  let rig: BrowserRig;
  let day = '';
  let farmId = 0;
  let jobId = 0;
  const owner = demo('owner');
  const tomas = demo('operator', 0);

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    farmId = (await db('farms').where({ name: DEMO_FARM_NAME }).first('id')).id;
    day = await freeDay(rig);
    const tomasMembership = await db('memberships as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where({ 'u.email': tomas.email, 'm.farm_id': farmId })
      .first('m.id');
    const field = await db('fields').where({ farm_id: farmId }).orderBy('id').first('id', 'acres');
    const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    const machine = await db('machines').where({ farm_id: farmId, kind: 'tractor-4wd' }).first('id');
    if (!implement || !machine) throw new Error('The demo farm has no harrow or 4WD tractor: run scripts/prepare-db.ts --reset-demo');
    [{ id: jobId }] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: field.id,
        operation: 'harrowing',
        operator_id: tomasMembership.id,
        machine_id: machine.id,
        implement_id: implement.id,
        run_order: 1,
        acres_planned: field.acres,
      })
      .returning('id');
  });
  afterAll(async () => {
    await rig.t.db('assignments').where({ farm_id: farmId, day }).delete();
    await rig.t.db('board_changes').where({ farm_id: farmId, day }).delete();
    await rig.t.db('board_days').where({ farm_id: farmId, day }).delete();
    await rig.close();
  });

  it('when Tomas phones his start in, then the owner opens his run sheet from the board and logs it under her own name', async () => {
    const page = await rig.newPage();
    await signIn(page, owner);
    await page.goto(`/board?date=${day}`);
    await page.getByRole('link', { name: `Run sheet of ${tomas.name} (to log for them)` }).click();
    await page.getByRole('heading', { level: 1, name: 'Run sheet' }).waitFor();
    await page.getByRole('note').getByText(`You are logging for ${tomas.name}`).waitFor();
    expect(page.url()).toContain(`date=${day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: 'Harrowing' });
    await panel.getByRole('button', { name: 'Start' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByLabel('Engine hours at the start').waitFor();
    await dialog.getByRole('button', { name: 'Start' }).click();
    await dialog.waitFor({ state: 'detached' });
    await panel.locator('.log-actions .state').filter({ hasText: 'underway' }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await page.evaluate(() => document.querySelector('.mat-drawer-content')?.scrollTo(0, 0));
    await screenshot(page, 'run-sheet-owner-logs-for-operator');

    const ownerUser = await rig.t.db('users').where({ email: owner.email }).first('id');
    const events = await rig.t.db('assignment_events').where({ assignment_id: jobId }).select('type', 'by_user_id');
    expect(events).toEqual([{ type: 'start', by_user_id: ownerUser.id }]);
    expect((await rig.t.db('assignments').where({ id: jobId }).first('state')).state).toBe('underway');
  });

  it('when the owner switches back to her own sheet, then the note goes and the address carries no person', async () => {
    const page = await rig.newPage();
    await signIn(page, owner);
    const tomasId = (await rig.t.db('assignments').where({ id: jobId }).first('operator_id')).operator_id;
    await page.goto(`/run-sheet?date=${day}&person=${tomasId}`);
    await page.getByRole('note').waitFor();
    await page.getByRole('combobox', { name: 'Whose run sheet' }).click();
    await page.getByRole('option', { name: owner.name }).click();
    await page.getByText('Nothing on your run sheet for this day.').waitFor();
    expect(await page.getByRole('note').count()).toBe(0);
    expect(page.url()).not.toContain('person=');
  });
});
