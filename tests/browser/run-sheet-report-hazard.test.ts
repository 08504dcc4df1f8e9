// Reporting a hazard from the run sheet on a 390×844 phone: the operator taps the mini-map where the
// hazard is, and the point marked there never sits under the field's name, even at the very centre
// of the field where the name is written (the name moves off it, as it does off a stored hazard).
import type { Page } from 'playwright-core';
import { dayIn } from '../../shared/calendar';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { screenshot, signIn, startRig, type BrowserRig, openedDialog } from '../support/browser';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };
const plus = (day: string, n: number): string => new Date(Date.parse(`${day}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

interface Box {
  top: number;
  bottom: number;
  left: number;
  right: number;
}
const boxOf = (page: Page, selector: string): Promise<Box> =>
  page
    .locator(selector)
    .first()
    .evaluate((el) => {
      const r = el.getBoundingClientRect();
      return { top: r.top, bottom: r.bottom, left: r.left, right: r.right };
    });
const overlap = (a: Box, b: Box): boolean => a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;

describe('Reporting a hazard on the run sheet mini-map, on a phone', () => {
  let rig: BrowserRig;
  let job: PhoneJob;

  beforeAll(async () => {
    rig = await startRig();
    const farm = await rig.t.db('farms').where({ name: DEMO_FARM_NAME }).first('time_zone');
    job = await createPhoneJob(rig, {
      day: plus(dayIn(farm.time_zone), 400 + Math.floor(Math.random() * 300)),
      name: 'Ansel Marrow',
      corner: [-97.7, 46.8],
      engineHours: 1500,
    });
  });
  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  it('when the operator taps the middle of the field, where its name is written, then the marked point and the name do not overlap', async () => {
    const page = await rig.newPage();
    await signIn(page, job.person);
    await page.setViewportSize(PHONE);
    await page.goto(`/run-sheet?date=${job.day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: job.fieldName });
    await panel.getByRole('button', { name: 'Report a problem' }).click();
    const dialog = await openedDialog(page);
    await dialog.getByRole('radio', { name: 'A new hazard' }).check();
    const map = dialog.locator('app-field-map');
    const label = map.locator('.fm-label').first();
    await label.waitFor();
    await page.waitForTimeout(300);
    // Tap right on the centre of the field's name: the worst place for the new point.
    const before = await boxOf(page, 'mat-dialog-container app-field-map .fm-label');
    await page.mouse.click((before.left + before.right) / 2, (before.top + before.bottom) / 2);
    await dialog.getByText(/^Marked at \d+\.\d{5}° N, \d+\.\d{5}° W$/).waitFor();
    await map.locator('.fm-mark').waitFor();
    await page.waitForTimeout(300);
    const mark = await boxOf(page, 'mat-dialog-container app-field-map .fm-mark');
    const after = await boxOf(page, 'mat-dialog-container app-field-map .fm-label');
    // The point is where it was tapped, and the name has moved off it and still reads in full.
    expect(overlap(mark, before)).toBe(true);
    expect({ mark, label: after, overlaps: overlap(mark, after) }).toMatchObject({ overlaps: false });
    expect(await label.innerText()).toBe(job.fieldName);
    await screenshot(page, 'run-sheet-phone-report-hazard-mark-and-label');
  });
});
