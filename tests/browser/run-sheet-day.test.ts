// The operator's morning on a 390×844 phone: the run sheet opens on the next day with work and says
// so; after the first read of the day the cautions fold and the first job's Start button shows
// without scrolling; the finish logs engine hours from the meter apart from clock time; a hazard
// reported in the middle of the field does not hide under the field's name on the mini-map.
import type { Page } from 'playwright-core';
import { dayIn } from '../../shared/calendar';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, freeBoardDay, screenshot, seriousViolations, signIn, startRig, type BrowserRig, openedDialog } from '../support/browser';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };

/** The day `n` days after an ISO day, on the calendar. */
const plus = (day: string, n: number): string => new Date(Date.parse(`${day}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

/** Signs in at a desktop width (the sign-in helper waits for the side navigation, folded away on a phone), then turns into a 390×844 phone. */
async function onPhone(rig: BrowserRig, account: Parameters<typeof signIn>[1]): Promise<Page> {
  const page = await rig.newPage();
  await signIn(page, account);
  await page.setViewportSize(PHONE);
  return page;
}

/** The viewport rectangle of the first element matching a selector. */
const rectOf = (page: Page, selector: string) =>
  page
    .locator(selector)
    .first()
    .evaluate((el) => {
      const r = el.getBoundingClientRect();
      return { top: r.top, bottom: r.bottom, left: r.left, right: r.right };
    });

describe('The run sheet on a phone in a real browser', () => {
  let rig: BrowserRig;
  let job: PhoneJob;
  let farmId = 0;
  let fieldId = 0;
  let day = '';
  let tag = '';
  let fieldName = '';
  let person: PhoneJob['person'];

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: DEMO_FARM_NAME }).first('time_zone');
    // A day far enough ahead that the demo farm has no board there; published, with this person's
    // one job on a small square field with a hazard reported at its very centre, where the name sits.
    job = await createPhoneJob(rig, {
      day: plus(dayIn(farm.time_zone), 400 + Math.floor(Math.random() * 300)),
      name: 'Wren Halloway',
      corner: [-97.9, 46.9],
      engineHours: 2781,
      hazard: { kind: 'rock', at: [-97.9 + 0.00375, 46.9 + 0.0025], clearanceM: 3, note: 'Big rock', status: 'reported' },
    });
    ({ farmId, fieldId, day, tag, fieldName, person } = job);
  });
  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  it('when an operator with no work today opens the run sheet, then it shows the next day with work and says so; the second read folds the cautions and Start shows without scrolling', async () => {
    const page = await onPhone(rig, person);
    await page.goto('/run-sheet');
    const long = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', timeZone: 'UTC' }).format(
      new Date(`${day}T12:00:00Z`),
    );
    await page.getByRole('status').getByText(`No work today; showing ${long}, the next day with work.`).waitFor();
    const panel = page.locator('mat-expansion-panel').filter({ hasText: fieldName });
    // The first read of the day: the cautions are open.
    await panel.locator('.cautions li').first().waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'run-sheet-phone-first-read');

    await page.reload();
    await page.getByRole('status').getByText('the next day with work').waitFor();
    const fold = panel.getByRole('button', { name: /Cautions for harrowing/ });
    await fold.waitFor();
    expect(await fold.getAttribute('aria-expanded')).toBe('false');
    expect(await panel.locator('.cautions li').count()).toBe(0);
    const start = await rectOf(page, `mat-expansion-panel:has-text("${fieldName}") [data-action="start"]`);
    // Visible without scrolling: the whole button inside the 390×844 viewport.
    expect(start.top).toBeGreaterThanOrEqual(0);
    expect(start.bottom).toBeLessThanOrEqual(PHONE.height);
    expect(start.right).toBeLessThanOrEqual(PHONE.width);
    await page.screenshot({ path: await screenshot(page, 'run-sheet-phone-folded-cautions'), fullPage: false });
    // One tap opens them again.
    await fold.click();
    await panel.locator('.cautions li').first().waitFor();
    await fold.click();
  });

  it('when the operator reports a breakdown, then the owner sees the count on the shell at once, the report in the list with its job, field and machine, and confirms it', async () => {
    const phone = await onPhone(rig, person);
    await phone.goto(`/run-sheet?date=${day}`);
    const panel = phone.locator('mat-expansion-panel').filter({ hasText: fieldName });
    await panel.getByRole('button', { name: 'Report a problem' }).click();
    const dialog = await openedDialog(phone);
    await dialog.getByRole('radio', { name: 'Breakdown' }).check();
    // The usual caution before anyone works on a machine (common practice, no published source quoted).
    const caution = dialog.locator('[data-breakdown-caution]');
    expect(await caution.innerText()).toMatch(/shut the engine off and take the key/);
    const icon = await caution.locator('mat-icon').boundingBox();
    expect(icon!.width).toBeGreaterThanOrEqual(20);
    await screenshot(phone, 'run-sheet-breakdown-caution');
    await dialog.getByLabel('What happened').fill(`Hydraulic hose burst ${tag}`);
    await dialog.getByRole('button', { name: 'Send report' }).click();
    await dialog.waitFor({ state: 'detached' });

    const desk = await rig.newPage();
    await signIn(desk, demo('owner'));
    const bell = desk.getByRole('link', { name: /^Reports from the field: \d+ open$/ });
    await bell.waitFor();
    const before = Number((await bell.getAttribute('aria-label'))!.match(/(\d+) open/)![1]);
    expect(before).toBeGreaterThanOrEqual(1);
    await bell.click();
    await desk.getByRole('heading', { level: 1, name: 'Reports from the field' }).waitFor();
    const item = desk.locator('li.report').filter({ hasText: `Hydraulic hose burst ${tag}` });
    await item.waitFor();
    expect(await item.innerText()).toContain(`Breakdown: ${fieldName}`);
    expect(await item.innerText()).toContain(`with 4WD ${tag}`);
    expect(await item.getByRole('link', { name: fieldName }).getAttribute('href')).toBe(`/fields/${fieldId}`);
    expect(await item.getByRole('link', { name: /^The job on / }).getAttribute('href')).toBe(`/board?date=${day}`);
    await desk
      .locator('[data-machine-down]')
      .filter({ hasText: `4WD ${tag}` })
      .waitFor();
    expect(await seriousViolations(desk)).toEqual([]);
    await screenshot(desk, 'reports-owner-list');

    // The board flags the machine on the job's card while the report is open.
    await desk.goto(`/board?date=${day}`);
    const card = desk.locator('app-assignment-card').filter({ hasText: fieldName });
    await card
      .locator('.conflict-soft')
      .filter({ hasText: `4WD ${tag} was reported broken down` })
      .waitFor();
    expect(
      await card
        .locator('.conflict-soft')
        .filter({ hasText: `Hydraulic hose burst ${tag}` })
        .count(),
    ).toBe(1);
    await card.scrollIntoViewIfNeeded();
    await screenshot(desk, 'board-machine-reported-down');
    await desk.goto('/reports');
    await item.getByRole('button', { name: 'Confirm' }).click();
    await item.waitFor({ state: 'detached' });
    await desk
      .getByRole('link', { name: before - 1 === 0 ? 'Reports from the field: none open' : `Reports from the field: ${before - 1} open` })
      .waitFor();
    const mail = await rig.t
      .db('mail_outbox')
      .where({ farm_id: farmId, kind: 'field-report' })
      .andWhere('text_body', 'like', `%Hydraulic hose burst ${tag}%`);
    expect(mail.length).toBeGreaterThanOrEqual(1);
    // Confirmed: the board no longer flags the machine.
    await desk.goto(`/board?date=${day}`);
    await card.waitFor();
    expect(await card.locator('.conflict-soft').filter({ hasText: 'reported broken down' }).count()).toBe(0);
  });

  it('when the job starts at meter 2781 and finishes at 2789.4, then the log shows 8.4 engine hours and the clock time apart', async () => {
    // A start waits for the job's day: the job moves to a day gone by to be started now.
    day = await freeBoardDay(rig, undefined, { past: true });
    await job.moveTo(day);
    const page = await onPhone(rig, person);
    await page.goto(`/run-sheet?date=${day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: fieldName });
    await panel.locator('[data-action="start"]').click();
    let dialog = await openedDialog(page);
    expect(await dialog.getByLabel('Engine hours at the start').inputValue()).toBe('2781');
    await dialog.getByRole('button', { name: 'Start' }).click();
    await dialog.waitFor({ state: 'detached' });
    await panel.locator('[data-action="finish"]').click();
    dialog = await openedDialog(page);
    await dialog.getByLabel('Engine hours at the end').fill('2789.4');
    // 2789.4 − 2781 = 8.4 h: the worked example of the issue, by plain subtraction.
    await dialog.getByText('8.4 engine hours on this job').waitFor();
    await dialog.getByRole('button', { name: 'Finish' }).click();
    await dialog.waitFor({ state: 'detached' });
    const engine = panel.locator('[data-total="engine-hours"] dd');
    await engine.waitFor();
    expect((await engine.innerText()).replace(/\s+/g, ' ')).toBe('8.4 h meter 2,781.0 h → 2,789.4 h');
    expect(await panel.locator('[data-total="clock-time"] dd').innerText()).toMatch(/^(under a minute|1 min) /);
    expect(await panel.innerText()).not.toMatch(/Worked: 0 h/);
    await panel.locator('.log').scrollIntoViewIfNeeded();
    await screenshot(page, 'run-sheet-phone-finished-meter-hours');
  });

  it('when a hazard is reported at the middle of the field, then the field name on the mini-map moves off the hazard marker and both read', async () => {
    const page = await onPhone(rig, person);
    await page.goto(`/run-sheet?date=${day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: fieldName });
    // The job is finished by now, so the sheet does not open it by itself.
    await panel.locator('mat-expansion-panel-header').click();
    await panel.locator('.fm-hazard').first().waitFor();
    await panel.locator('.fm-label').first().waitFor();
    await panel.locator('app-field-map').scrollIntoViewIfNeeded();
    await page.waitForTimeout(300);
    const label = await rectOf(page, `mat-expansion-panel:has-text("${fieldName}") .fm-label`);
    const marker = await rectOf(page, `mat-expansion-panel:has-text("${fieldName}") .fm-hazard`);
    const overlaps = label.left < marker.right && marker.left < label.right && label.top < marker.bottom && marker.top < label.bottom;
    expect({ label, marker, overlaps }).toMatchObject({ overlaps: false });
    await screenshot(page, 'run-sheet-phone-mini-map-hazard-and-label');
  });
});
