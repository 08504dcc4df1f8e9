import type { Page } from 'playwright-core';
import { seedDemoFields } from '../../seeds/02_demo_fields';
import { demo, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';

const figure = (page: Page, key: string) => page.locator(`[data-key="${key}"] .value`);

/** Waits until the card shows the plan for `headingDeg` and returns its pass and turn counts. */
async function figuresAt(page: Page, headingDeg: number): Promise<string> {
  await figure(page, 'heading')
    .filter({ hasText: new RegExp(`^${headingDeg}\\.0°$`) })
    .waitFor();
  await page.locator('app-plan-summary section[aria-busy="false"]').waitFor();
  return `${await figure(page, 'passes').innerText()} passes, ${await figure(page, 'turns').innerText()} turns`;
}

describe('the Pass plan screen in a real browser', () => {
  let rig: BrowserRig;
  let fieldId: number;
  let before: Record<string, unknown> | undefined;

  beforeAll(async () => {
    rig = await startRig();
    // The demo farm's "Home Quarter" (other tests make farms of their own with other fields).
    const { db } = rig.t;
    const owner = await db('users as u')
      .join('memberships as m', 'm.user_id', 'u.id')
      .where({ 'u.email': demo('owner').email })
      .first('u.id', 'm.farm_id');
    const homeQuarter = () => db('fields').where({ farm_id: owner.farm_id, name: 'Home Quarter' }).first('id');
    // A test database seeded before the demo fields existed has the demo farm without fields: add
    // them (additive; the farm and its people stay as they are).
    if (!(await homeQuarter())) await db.transaction((tx) => seedDemoFields(tx, { farmId: owner.farm_id, users: {} }));
    fieldId = (await homeQuarter()).id;
    before = await rig.t.db('pass_plans').where({ field_id: fieldId, operation: 'harrowing' }).first();
  });

  afterAll(async () => {
    if (!fieldId) return rig?.close();
    // Leave the demo farm's harrowing plan as it was found.
    const where = { field_id: fieldId, operation: 'harrowing' };
    if (before) {
      const { id: _id, ...row } = before;
      await rig.t
        .db('pass_plans')
        .where(where)
        .update({ ...row, summary: JSON.stringify(row.summary) });
    } else await rig.t.db('pass_plans').where(where).delete();
    await rig.close();
  });

  const link = () => `/pass-plan?field=${fieldId}&operation=harrowing`;

  it('when the owner sets a width and moves the heading, then the plan follows live and saves', async () => {
    const page = await rig.newPage({ width: 1280, height: 1600 });
    await signIn(page, demo('owner'));
    await page.goto(link());
    await page.getByRole('heading', { level: 1, name: 'Pass plan' }).waitFor();
    await page.getByLabel('Working width (ft)').fill('60');
    // The demo harrow works 84 ft: planning it at 60 ft is a visible warning beside the width.
    await page.getByText('84 ft heavy harrow works 84.0 ft; this plan uses 60.0 ft.').waitFor();
    await screenshot(page, 'pass-plan-width-warning');
    // Auto offers its best headings with their time, passes and turns; the first is along an edge.
    const offered = page.getByRole('table', { name: 'Best headings' });
    await offered.waitFor();
    expect(await offered.locator('tbody tr').count()).toBeGreaterThanOrEqual(2);
    expect(await offered.locator('tbody tr').first().innerText()).toMatch(/along an edge/);
    await offered.scrollIntoViewIfNeeded();
    await screenshot(page, 'pass-plan-heading-candidates');
    await page.getByRole('switch', { name: 'Auto (least field time)' }).waitFor();
    if (await page.getByRole('switch', { name: 'Auto (least field time)' }).isChecked()) {
      await page.getByRole('switch', { name: 'Auto (least field time)' }).click();
    }

    await page.getByLabel('Heading (°)').fill('45');
    const at45 = await figuresAt(page, 45);
    await page.getByLabel('Heading (°)').fill('0');
    const at0 = await figuresAt(page, 0);
    expect(at0).not.toEqual(at45);

    // The slider drives the same heading: End takes it to 179°.
    await page.getByLabel('Heading slider, degrees clockwise from north').focus();
    await page.keyboard.press('End');
    await figuresAt(page, 179);
    expect(await page.getByLabel('Heading (°)').inputValue()).toBe('179');
    await page.keyboard.press('Home');
    expect(await figuresAt(page, 0)).toEqual(at0);

    expect(await page.locator('.pp-pass-label').count()).toBeGreaterThan(0);
    expect(await page.locator('path.pp-pass').count()).toBeGreaterThan(0);
    expect(await page.getByText('Cautions for harrowing').isVisible()).toBe(true);

    await page.getByRole('button', { name: 'Save plan' }).click();
    await page.getByText('Pass plan saved for Home Quarter, harrowing.').waitFor();
    await page.getByText('Saved.', { exact: true }).waitFor();
    await page.getByRole('link', { name: /Download passes \(GeoJSON\)/ }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'pass-plan-owner');

    // A heading outside 0–179 is marked where it is typed, Save is off, and no internal name shows.
    await page.getByLabel('Heading (°)').fill('200');
    await page.getByText('Enter a heading from 0 to 179°').first().waitFor();
    expect(await page.getByRole('button', { name: 'Save plan' }).isDisabled()).toBe(true);
    expect(await page.locator('body').innerText()).not.toMatch(/headingDeg|widthM/);
    await screenshot(page, 'pass-plan-heading-invalid');
    await page.getByLabel('Heading (°)').fill('0');

    // A width the planner refuses shows its message, not NaN, and the map is kept, marked out of date.
    await page.getByLabel('Working width (ft)').fill('5000');
    const alert = page.locator('app-plan-summary [role="alert"]');
    await alert.waitFor();
    expect(await alert.innerText()).not.toMatch(/NaN|undefined|\{/);
    await page.getByText('Out of date: the map shows the last plan that worked.').waitFor();
    await screenshot(page, 'pass-plan-owner-error');

    // A negative width is refused in the form's words and units: no metres ("got -1.524") and no
    // "Passes, acres and hours are for -5.0 ft" beside it.
    await page.getByLabel('Working width (ft)').fill('-5');
    await alert.filter({ hasText: 'Working width' }).waitFor();
    const said = await page.locator('body').innerText();
    expect(said).not.toMatch(/got -|-1\.52|are for -5/);
  });

  it('when an operator opens the same deep link, then the saved plan shows read-only', async () => {
    const page = await rig.newPage({ width: 1280, height: 1600 });
    await signIn(page, demo('operator'));
    await page.goto(link());
    const settings = page.getByRole('definition').first();
    await settings.waitFor();
    const text = await page.locator('[aria-label="Plan settings"]').innerText();
    expect(text).toContain('60.0 ft');
    expect(text).toMatch(/Heading\s+0\.0°/);
    await figure(page, 'heading')
      .filter({ hasText: /^0\.0°$/ })
      .waitFor();
    expect(await page.getByRole('button', { name: 'Save plan' }).count()).toBe(0);
    expect(await page.getByLabel('Working width (ft)').count()).toBe(0);
    await page.getByRole('link', { name: /Download passes \(GeoJSON\)/ }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'pass-plan-operator');

    // Night work in a cab: the dark theme keeps the plan readable.
    await page.getByRole('button', { name: 'Switch to dark theme' }).click();
    await page.getByRole('button', { name: 'Switch to light theme' }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'pass-plan-operator-dark');
  });

  it('when every page above loaded, then no request left 127.0.0.1', () => {
    expect(rig.outside).toEqual([]);
  });
});
