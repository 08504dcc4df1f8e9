import type { Page } from 'playwright-core';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

/** Names no demo implement or other test uses. */
const tag = `T${Date.now().toString(36).slice(-5)}${Math.floor(Math.random() * 1296).toString(36)}`;
const tractorName = `${tag} 4WD`;
const harrowName = `${tag} light harrow`;

/** A write from inside the page, with the page's own XSRF token, so only the role can refuse it. */
async function sendFromPage(page: Page, method: string, url: string, body: unknown): Promise<number> {
  return page.evaluate(
    async ({ method, url, body }) => {
      const token = decodeURIComponent(
        document.cookie
          .split('; ')
          .find((c) => c.startsWith('XSRF-TOKEN='))
          ?.split('=')[1] ?? '',
      );
      const res = await fetch(url, {
        method,
        headers: { 'Content-Type': 'application/json', 'X-XSRF-TOKEN': token },
        body: JSON.stringify(body),
      });
      return res.status;
    },
    { method, url, body },
  );
}

describe('Fleet and Crew in a real browser', () => {
  let rig: BrowserRig;

  beforeAll(async () => {
    rig = await startRig();
  });
  afterAll(async () => {
    // When a test failed half-way, take away what this run added (the demo farm is shared).
    await rig.t.db('implements').where({ name: harrowName }).delete();
    await rig.t.db('machines').where({ name: tractorName }).delete();
    await rig.close();
  });

  async function pageFor(role: 'owner' | 'viewer'): Promise<Page> {
    const page = await rig.newPage();
    await signIn(page, demo(role));
    return page;
  }

  const implementRow = (page: Page, name: string) =>
    page.locator('app-implements-table tr.mat-mdc-row').filter({ has: page.getByText(name, { exact: true }) });

  it('when the owner adds a tractor past its service hours, then it is listed with an overdue warning', async () => {
    const page = await pageFor('owner');
    await page.goto('/fleet');
    await page.getByRole('heading', { level: 1, name: 'Fleet' }).waitFor();
    await page.getByRole('button', { name: 'Add machine' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a machine' });
    await dialog.getByLabel('Name').fill(tractorName);
    await dialog.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: '4WD tractor', exact: true }).click();
    await dialog.getByLabel('Power (hp)').fill('480');
    await dialog.getByLabel('Engine hours').fill('1260');
    await dialog.getByLabel('Service interval (h)').fill('250');
    await dialog.getByLabel('Hours at last service').fill('1000');
    expect(await seriousViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Save machine' }).click();
    await dialog.waitFor({ state: 'detached' });
    const row = page.locator('app-machines-table tr.mat-mdc-row').filter({ has: page.getByText(tractorName, { exact: true }) });
    await row.waitFor();
    expect((await row.locator('.mat-column-service').innerText()).trim()).toContain('Service overdue by 10.0 h');
    expect((await row.locator('.mat-column-power').innerText()).trim()).toBe('480 hp');
  });

  it('when the owner adds an implement 42 ft wide, then a negative width is refused first and then it is listed in feet', async () => {
    const page = await pageFor('owner');
    const posts: string[] = [];
    page.on('request', (req) => {
      if (req.method() === 'POST' && req.url().endsWith('/api/fleet/implements')) posts.push(req.postData() ?? '');
    });
    await page.goto('/fleet');
    await page.getByRole('heading', { level: 1, name: 'Fleet' }).waitFor();
    await page.locator('app-machines-table').getByText(tractorName, { exact: true }).waitFor();
    expect(await page.locator('h1').count()).toBe(1);
    expect(await page.getByRole('alert').count()).toBe(0);

    await page.getByRole('button', { name: 'Add implement' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add an implement' });
    await dialog.waitFor();
    await dialog.getByLabel('Name').fill(harrowName);
    await dialog.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Harrow', exact: true }).click();
    expect(await dialog.getByRole('checkbox', { name: 'Harrowing' }).isChecked()).toBe(true);
    expect(await dialog.getByRole('checkbox', { name: 'Seeding' }).count()).toBe(0);
    await dialog.getByLabel('Working width (ft)').fill('-42');
    await dialog.getByRole('button', { name: 'Save implement' }).click();
    await dialog.getByText('Working width must be more than 0').waitFor();
    expect(await dialog.getByLabel('Name').inputValue()).toBe(harrowName);
    expect(posts).toEqual([]);
    await screenshot(page, 'fleet-1-negative-width');

    await dialog.getByLabel('Working width (ft)').fill('42');
    await dialog.getByLabel('Transport width (ft)').fill('14');
    await dialog.getByRole('combobox', { name: 'Machines that pull or carry it' }).click();
    await page.getByRole('option', { name: new RegExp(`^${tractorName} `) }).click();
    await page.keyboard.press('Escape');
    await dialog.getByText('slow-moving-vehicle emblem', { exact: false }).waitFor();
    await dialog.getByText('overhead power lines', { exact: false }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'fleet-2-implement-form-cautions');

    // Minimum power: its label floats clear above the typed value and the field lies wholly inside the form.
    const power = dialog.getByLabel('Minimum power (hp)');
    await power.fill('120');
    await dialog.getByLabel('Notes').click();
    await power.scrollIntoViewIfNeeded();
    const boxes = await dialog
      .locator('mat-form-field')
      .filter({ hasText: 'Minimum power' })
      .evaluate((field) => {
        const box = (el: Element | null) => {
          const r = el!.getBoundingClientRect();
          return { top: r.top, bottom: r.bottom, left: r.left, right: r.right };
        };
        return {
          label: box(field.querySelector('label')),
          input: box(field.querySelector('input')),
          field: box(field),
          content: box(field.closest('mat-dialog-content')),
          labelClipped:
            (field.querySelector('mat-label') as HTMLElement).scrollWidth > (field.querySelector('label') as HTMLElement).clientWidth + 1,
        };
      });
    expect(boxes.label.bottom).toBeLessThanOrEqual(boxes.input.top + 1);
    expect(boxes.labelClipped).toBe(false);
    expect(boxes.field.left).toBeGreaterThanOrEqual(boxes.content.left);
    expect(boxes.field.right).toBeLessThanOrEqual(boxes.content.right);
    expect(boxes.field.top).toBeGreaterThanOrEqual(boxes.content.top);
    expect(boxes.field.bottom).toBeLessThanOrEqual(boxes.content.bottom);
    await screenshot(page, 'fleet-2b-implement-form-minimum-power');
    await dialog.getByRole('button', { name: 'Save implement' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(posts).toHaveLength(1);
    expect(JSON.parse(posts[0])).toMatchObject({
      name: harrowName,
      kind: 'harrow',
      widthM: 12.8016,
      transportWidthM: 4.2672,
      operations: ['harrowing'],
    });
    expect(JSON.parse(posts[0]).machineIds).toHaveLength(1);

    await page.reload();
    const row = implementRow(page, harrowName);
    await row.waitFor();
    expect((await row.locator('.mat-column-width').innerText()).trim()).toBe('42.0 ft');
    expect((await row.locator('.mat-column-transportWidth').innerText()).trim()).toBe('14.0 ft');
    expect((await row.locator('.mat-column-operations').innerText()).trim()).toBe('Harrowing');
    expect((await row.locator('.mat-column-pulledBy').innerText()).trim()).toBe(tractorName);
    await row.getByText('Wide on the road').waitFor();
    await page.getByText('slow-moving-vehicle emblem', { exact: false }).first().waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'fleet-3-owner-machines');
    // The shell scrolls its content pane, not the page, so a full-page shot stops at the fold.
    await page.getByRole('heading', { name: 'Implements' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
    await screenshot(page, 'fleet-4-owner-implements');
    const stored = await rig.t.db('implements').where({ name: harrowName }).first('width_m');
    expect(stored.width_m).toBeCloseTo(12.8016, 6);
  });

  it('when the owner adds a second implement with the same name, then the server message shows on the name and nothing is saved', async () => {
    const page = await pageFor('owner');
    await page.goto('/fleet');
    await implementRow(page, harrowName).waitFor();
    await page.getByRole('button', { name: 'Add implement' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add an implement' });
    await dialog.getByLabel('Name').fill(harrowName);
    await dialog.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Harrow', exact: true }).click();
    await dialog.getByLabel('Working width (ft)').fill('30');
    await dialog.getByRole('button', { name: 'Save implement' }).click();
    await dialog.getByText('Name already used', { exact: true }).waitFor();
    expect(await dialog.getByLabel('Working width (ft)').inputValue()).toBe('30');
    await screenshot(page, 'fleet-5-name-taken');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'detached' });
    const [{ n }] = await rig.t.db('implements').whereRaw('lower(name) = lower(?)', [harrowName]).count({ n: '*' });
    expect(Number(n)).toBe(1);
  });

  it('when a viewer opens Fleet, then it is read-only and a direct write is refused', async () => {
    const page = await pageFor('viewer');
    await page.goto('/fleet');
    await implementRow(page, harrowName).waitFor();
    await page.getByText('Only an owner can change the fleet.').waitFor();
    for (const name of ['Add machine', 'Add implement']) expect(await page.getByRole('button', { name }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^(Edit|Delete) / }).count()).toBe(0);
    expect(await page.locator('main button, main input, main mat-select').count()).toBe(0);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'fleet-6-viewer');
    await page.getByRole('heading', { name: 'Implements' }).evaluate((h) => h.scrollIntoView({ block: 'start' }));
    await screenshot(page, 'fleet-7-viewer-implements');

    const id = (await rig.t.db('implements').where({ name: harrowName }).first('id')).id as number;
    expect(await sendFromPage(page, 'PATCH', `/api/fleet/implements/${id}`, { widthM: 1 })).toBe(403);
  });

  it('when the owner deletes the implement and the tractor, then they leave the lists', async () => {
    const page = await pageFor('owner');
    await page.goto('/fleet');
    await implementRow(page, harrowName).waitFor();
    await page.getByRole('button', { name: `Delete ${harrowName}` }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Delete' }).click();
    await page.getByText(`${harrowName} was deleted.`).waitFor();
    expect(await implementRow(page, harrowName).count()).toBe(0);
    await page.getByRole('button', { name: `Delete ${tractorName}` }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Delete' }).click();
    await page.getByText(`${tractorName} was deleted.`).waitFor();
    expect(await page.locator('app-machines-table').getByText(tractorName, { exact: true }).count()).toBe(0);
  });

  it('when the owner sets a crew skill, then it is confirmed and still there after a reload', async () => {
    const page = await pageFor('owner');
    await page.goto('/crew');
    await page.getByRole('heading', { level: 1, name: 'Crew' }).waitFor();
    await page.getByText('A learner may be assigned an operation only with a mentor on the same day and field.').waitFor();
    // Ada's baling: no demo job or other test leans on it. Put back what was there at the end.
    const cell = page.getByRole('combobox', { name: 'Baling — Ada Lindqvist' });
    await cell.waitFor();
    const before = (await cell.innerText()).trim();
    const next = before === 'Learning' ? 'Qualified' : 'Learning';
    await cell.click();
    await page.getByRole('option', { name: next, exact: true }).click();
    await page
      .getByText(next === 'Learning' ? 'Ada Lindqvist is now learning baling.' : 'Ada Lindqvist is now qualified for baling.')
      .waitFor();
    expect(await page.locator('h1').count()).toBe(1);
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'crew-1-owner');

    await page.reload();
    await expectText(page, 'Baling — Ada Lindqvist', next);

    await page.getByRole('combobox', { name: 'Baling — Ada Lindqvist' }).click();
    await page.getByRole('option', { name: before, exact: true }).click();
    await page
      .getByText(/Ada Lindqvist is (now|no longer)/)
      .last()
      .waitFor();
  });

  it('when a viewer tries to set a skill, then the server refuses it', async () => {
    const page = await pageFor('viewer');
    await page.goto('/fleet');
    await page.getByRole('heading', { level: 1, name: 'Fleet' }).waitFor();
    const ada = await rig.t
      .db('memberships as m')
      .join('users as u', 'u.id', 'm.user_id')
      .where('u.email', 'ada@tamarack-ridge.example')
      .first('m.id');
    expect(await sendFromPage(page, 'PUT', `/api/crew/${ada.id}/skills/baling`, { level: 'mentor' })).toBe(403);
  });

  it('when every page above loaded, then no request left 127.0.0.1', () => {
    expect(rig.outside).toEqual([]);
  });
});

async function expectText(page: Page, label: string, text: string): Promise<void> {
  const cell = page.getByRole('combobox', { name: label });
  await cell.waitFor();
  expect((await cell.innerText()).trim()).toBe(text);
}
