import { HAZARD_LABELS, type HazardKind } from '../../shared/schemas/fields';
import { NUL_MESSAGE } from '../../shared/schemas/common';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

/** A name no demo implement or other test uses. */
const tag = `T${Date.now().toString(36).slice(-5)}${Math.floor(Math.random() * 1296).toString(36)}`;
const newName = `${tag} rotary harrow`;

describe('Form errors in a real browser', () => {
  let rig: BrowserRig;

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(async () => {
    // Nothing should have been saved; if a step failed after a save, take it away again.
    await rig.t.db('implements').where({ name: newName }).delete();
    await rig.close();
  });

  it('when Add implement is saved with a width of 0, then Save is off, the width is marked and in view, and a taken name is named by its label', async () => {
    const page = await rig.newPage();
    const posts: string[] = [];
    page.on('request', (req) => {
      if (req.method() === 'POST' && req.url().endsWith('/api/fleet/implements')) posts.push(req.postData() ?? '');
    });
    await signIn(page, demo('owner'));
    // A phone-sized window: the dialog scrolls, so the marked box has to be brought into view.
    await page.setViewportSize({ width: 390, height: 640 });
    await page.goto('/fleet');
    const firstRow = page.locator('app-implements-table tr.mat-mdc-row').first();
    await firstRow.waitFor();
    const takenName = (await firstRow.locator('.mat-column-name').innerText()).split('\n')[0].trim();

    await page.getByRole('button', { name: 'Add implement' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add an implement' });
    await dialog.waitFor();
    await dialog.getByLabel('Name').fill(newName);
    await dialog.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Harrow', exact: true }).click();
    const width = dialog.getByLabel('Working width (ft)');
    await width.fill('0');
    // Typed last, at the foot of the dialog: the width box is scrolled out of sight.
    await dialog.getByLabel('Notes').fill('For the stony quarter');
    const save = dialog.getByRole('button', { name: 'Save implement' });
    await save.click();

    // The form names the box by its label (never the API's widthM), marks it and brings it into view.
    await dialog.getByRole('alert').filter({ hasText: 'Check Working width.' }).waitFor();
    expect(await width.getAttribute('aria-invalid')).toBe('true');
    await dialog.getByText('Working width must be more than 0').waitFor();
    await page.waitForFunction(() => {
      const input = document.querySelector('mat-dialog-container input[formcontrolname="width"]');
      const content = document.querySelector('mat-dialog-content');
      if (!input || !content) return false;
      const box = input.getBoundingClientRect();
      const view = content.getBoundingClientRect();
      return box.top >= view.top && box.bottom <= view.bottom;
    });
    expect(await width.evaluate((el) => el === document.activeElement)).toBe(true);
    expect(await save.isDisabled()).toBe(true);
    expect(await page.locator('body').innerText()).not.toMatch(/widthM|transportWidthM|minPowerHp/);
    expect(posts).toEqual([]);
    await screenshot(page, 'form-errors-1-implement-width-blocked');

    // Fixed, Save comes back; a name the farm already uses is refused by the server, named by its label.
    await width.fill('30');
    await dialog.getByRole('alert').filter({ hasText: 'Check Working width.' }).waitFor({ state: 'detached' });
    expect(await save.isDisabled()).toBe(false);
    const name = dialog.getByLabel('Name');
    await name.fill(takenName);
    await save.click();
    await dialog.getByRole('alert').filter({ hasText: 'Check Name: Name already used' }).waitFor();
    expect(await name.getAttribute('aria-invalid')).toBe('true');
    expect(await save.isDisabled()).toBe(true);
    expect(posts).toHaveLength(1);
    await screenshot(page, 'form-errors-2-implement-name-taken');

    // Changing the name lets the owner try again.
    await name.fill(newName);
    expect(await save.isDisabled()).toBe(false);
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(await rig.t.db('implements').where({ name: newName }).first()).toBeUndefined();
  });
  it('when a hazard note holds a pasted control character, then the server refusal shows under Note by its label and Save waits for a change', async () => {
    // One hazard of the demo owner's own farm (other files share the database).
    const owner = demo('owner');
    const membership = await rig.t
      .db('memberships')
      .join('users', 'users.id', 'memberships.user_id')
      .where({ 'users.email': owner.email })
      .orderBy('memberships.farm_id', 'desc')
      .first('memberships.farm_id');
    const hazard = await rig.t.db('hazards').where({ farm_id: membership.farm_id }).orderBy('id').first();
    expect(hazard).toBeDefined();
    const label = HAZARD_LABELS[hazard.kind as HazardKind];

    const page = await rig.newPage({ width: 1366, height: 900 });
    const patches: string[] = [];
    page.on('request', (req) => {
      if (req.method() === 'PATCH' && req.url().endsWith(`/api/fields/${hazard.field_id}/hazards/${hazard.id}`))
        patches.push(req.postData() ?? '');
    });
    await signIn(page, owner);
    await page.goto(`/fields/${hazard.field_id}`);
    await page
      .locator(`#hazard-${hazard.id}`)
      .getByRole('button', { name: `Edit ${label}`, exact: true })
      .click();
    const form = page.locator('app-hazard-form');
    await form.getByRole('heading', { name: 'Edit hazard' }).waitFor();

    // A note pasted from another program with an invisible NUL in it: only the server checks that.
    const note = form.getByLabel('Note');
    await note.evaluate((el: HTMLInputElement) => {
      el.value = 'Stone pile\u0000 by the gate';
      el.dispatchEvent(new Event('input', { bubbles: true }));
    });
    const save = form.getByRole('button', { name: 'Save hazard' });
    await save.click();

    await form
      .getByRole('alert')
      .filter({ hasText: `Check Note: This ${NUL_MESSAGE}` })
      .waitFor();
    expect(patches).toHaveLength(1);
    expect(await note.getAttribute('aria-invalid')).toBe('true');
    await form
      .locator('mat-form-field')
      .filter({ hasText: 'Note' })
      .locator('mat-error')
      .filter({ hasText: `This ${NUL_MESSAGE}` })
      .waitFor();
    expect(await save.isDisabled()).toBe(true);
    expect(await page.locator('body').innerText()).not.toMatch(/clearanceM|Check the body|note must/);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'form-errors-3-hazard-note-refused');

    // Typing it again clean lets the owner save; here they cancel, and nothing was changed.
    await note.fill('Stone pile by the gate');
    expect(await save.isDisabled()).toBe(false);
    await form.getByRole('button', { name: 'Cancel' }).click();
    await form.waitFor({ state: 'detached' });
    const after = await rig.t.db('hazards').where({ id: hazard.id, farm_id: membership.farm_id }).first();
    expect(after.note).toBe(hazard.note);
    expect(after.clearance_m).toBe(hazard.clearance_m);
  });
});
