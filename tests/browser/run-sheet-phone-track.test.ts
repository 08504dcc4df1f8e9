// "Record track" on a 390×844 phone with the browser's geolocation emulated and moved over time:
// the operator starts the job, turns recording on, drives a pass, pauses (nothing is recorded
// while paused), reloads (the switch and the points kept on the phone are still there), resumes,
// drives a second pass and finishes. The farm's server holds the thinned points, and the owner
// sees the job's coverage measured from the phone track. Covered acres are checked against an
// independent overlay made with @turf/turf (buffer, intersect, area), a general-purpose library.
import * as turf from '@turf/turf';
import type { Position } from 'geojson';
import type { Locator, Page } from 'playwright-core';
import { demo, freeBoardDay, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { rect } from '../support/geo-fixtures';
import { waitForOfflineReady } from '../support/offline';
import { createPhoneJob, type PhoneJob } from '../support/phone-job';

const PHONE = { width: 390, height: 844 };
const CORNER: [number, number] = [-98.31, 47.12];
/** The field is 0.0075° × 0.005° (tests/support/phone-job.ts). */
const boundary = rect(CORNER[0], CORNER[1], 0.0075, 0.005);
/** Two passes up and down, 30 m beyond each end of the field, a fix every 25 m. */
const LONS = [CORNER[0] + 0.002, CORNER[0] + 0.0045];
const STEP_DEG = 0.000225;

function passPoints(k: number): Position[] {
  const south = CORNER[1] - 0.00027;
  const north = CORNER[1] + 0.005 + 0.00027;
  const n = Math.ceil((north - south) / STEP_DEG);
  const pts = Array.from({ length: n + 1 }, (_, i) => [LONS[k], south + ((north - south) * i) / n]);
  return k % 2 === 0 ? pts : pts.reverse();
}

describe('Record track on the run sheet, in a real browser', () => {
  let rig: BrowserRig;
  let job: PhoneJob;
  let widthM = 0;

  beforeAll(async () => {
    rig = await startRig();
    // A day gone by: the operator starts the job now, and a start waits for the job's day.
    job = await createPhoneJob(rig, {
      day: await freeBoardDay(rig, undefined, { past: true }),
      name: 'Wren Tallis',
      corner: CORNER,
      engineHours: 2210,
    });
    const a = await rig.t.db('assignments').where({ id: job.jobId }).first('implement_id');
    widthM = (await rig.t.db('implements').where({ id: a.implement_id }).first('width_m')).width_m;
  });
  afterAll(async () => {
    await job?.remove();
    await rig.close();
  });

  const driveTo = (page: Page, at: Position) => page.context().setGeolocation({ longitude: at[0], latitude: at[1], accuracy: 4 });
  /** Drives along `points`, a fix every 1.2 s (the recorder keeps at most one a second). */
  async function drive(page: Page, points: Position[]): Promise<void> {
    for (const p of points) {
      await driveTo(page, p);
      await page.waitForTimeout(1200);
    }
  }
  async function openJob(page: Page): Promise<Locator> {
    const panel = page.locator('mat-expansion-panel').filter({ hasText: job.fieldName });
    await panel.waitFor();
    // The panel opens by itself when it is the day's only job; its map and aids load just after.
    const header = panel.locator('mat-expansion-panel-header');
    if ((await header.getAttribute('aria-expanded')) !== 'true') await header.click();
    await panel.locator('app-track-recorder').waitFor();
    return panel;
  }
  /**
   * The open dialog once Material has finished opening it (the page's CSP allows no string
   * evaluation once the service worker serves it, so no waitForFunction here).
   */
  async function dialogOpen(page: Page): Promise<Locator> {
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    await page.locator('mat-dialog-container.mdc-dialog--open:not(.mdc-dialog--opening)').waitFor();
    return dialog;
  }
  const onServer = async () => Number((await rig.t.db('assignment_track_points').where({ assignment_id: job.jobId }).count('* as n'))[0].n);
  const waiting = async (panel: Locator) => Number((await panel.locator('[data-track-counts]').textContent())?.match(/(\d+) points?/)?.[1]);

  it('when the operator records a track while the job is underway and finishes, then the server holds the thinned points and the owner sees coverage from the phone track', async () => {
    const db = rig.t.db;
    const page = await rig.newPage();
    await signIn(page, job.person);
    await page.setViewportSize(PHONE);
    const context = page.context();
    await context.grantPermissions(['geolocation'], { origin: rig.baseUrl });
    await driveTo(page, passPoints(0)[0]);
    await page.goto(`/run-sheet?date=${job.day}`);
    // The service worker keeps the app, so a reload with no signal opens it (tests/support/offline.ts).
    await waitForOfflineReady(page);
    let panel = await openJob(page);

    // Off by default, and only for a job that is underway.
    const toggle = panel.getByRole('switch', { name: 'Record track' });
    expect(await toggle.getAttribute('aria-checked')).toBe('false');
    expect(await toggle.isDisabled()).toBe(true);
    await panel.getByText("sends it to your farm's own Furlong server only").waitFor();
    await panel.getByText('Do not handle the phone while driving').first().waitFor();

    await panel.locator('[data-action="start"]').click();
    const start = await dialogOpen(page);
    await start.getByLabel('Engine hours at the start').fill('2210.5');
    await start.getByRole('button', { name: 'Start' }).click();
    await start.waitFor({ state: 'detached' });
    await toggle.click();
    await panel.locator('.state[data-recording="true"]').getByText('Recording the track of this job.').waitFor();
    await panel.locator('app-track-recorder').scrollIntoViewIfNeeded();
    expect(await seriousViolations(page)).toEqual([]);
    await screenshot(page, 'run-sheet-phone-track-recording');

    // No signal for the first pass: the points wait on the phone.
    await page
      .locator('[data-sync]')
      .getByText(/All sent/)
      .waitFor();
    const before = await onServer();
    await context.setOffline(true);
    await drive(page, passPoints(0));
    const kept = await waiting(panel);
    expect(kept).toBeGreaterThanOrEqual(passPoints(0).length - 2);
    expect(await onServer()).toBe(before);

    // Paused: moving records nothing.
    await panel.locator('[data-action="pause"]').click();
    await panel.getByText('Paused: recording goes on when you resume the job.').waitFor();
    expect(await panel.locator('.state[data-recording="true"]').count()).toBe(0);
    await drive(page, [
      [LONS[1], CORNER[1] + 0.0054],
      [LONS[1], CORNER[1] + 0.0056],
    ]);
    expect(await waiting(panel)).toBe(kept);

    // A reload with no signal: the switch and the points not yet sent are still on the phone.
    await page.reload();
    panel = await openJob(page);
    expect(await panel.getByRole('switch', { name: 'Record track' }).getAttribute('aria-checked')).toBe('true');
    await panel.getByText('Paused: recording goes on when you resume the job.').waitFor();
    expect(await waiting(panel)).toBeGreaterThanOrEqual(kept);
    await screenshot(page, 'run-sheet-phone-track-offline-reloaded');

    // The signal returns: the pause and the points go to the farm's server.
    await context.setOffline(false);
    await panel
      .locator('[data-track-counts]')
      .getByText(/^\s*0 points on this phone/)
      .waitFor({ timeout: 30_000 });
    expect(Number((await db('assignment_track_points').where({ assignment_id: job.jobId }).count('* as n'))[0].n)).toBeGreaterThanOrEqual(
      kept,
    );

    await panel.locator('[data-action="resume"]').click();
    await panel.locator('.state[data-recording="true"]').waitFor();
    await drive(page, passPoints(1));
    await screenshot(page, 'run-sheet-phone-track-second-pass');

    await panel.locator('[data-action="finish"]').click();
    const finish = await dialogOpen(page);
    await finish.getByLabel('Acres done').fill('30');
    await finish.getByLabel('Engine hours at the end').fill('2211.4');
    await finish.getByRole('button', { name: 'Finish' }).click();
    await finish.waitFor({ state: 'detached' });
    // Finished: recording stops and the switch is off again.
    await panel.locator('.job-sub .state[data-state="finished"]').waitFor();
    await panel.locator('app-track-recorder [role="switch"][aria-checked="false"]').waitFor();
    await panel
      .locator('[data-track-counts]')
      .getByText(/^\s*0 points on this phone/)
      .waitFor({ timeout: 30_000 });

    // The server: every point at least 1 s and 2 m after the one before (turf's distance); the
    // coverage counts none taken while the job was paused.
    const points = await db('assignment_track_points').where({ assignment_id: job.jobId }).orderBy('at');
    expect(points.length).toBeGreaterThanOrEqual(passPoints(0).length + passPoints(1).length - 4);
    for (let i = 1; i < points.length; i++) {
      expect(points[i].at.getTime() - points[i - 1].at.getTime()).toBeGreaterThanOrEqual(1000);
      expect(
        turf.distance([points[i - 1].lon, points[i - 1].lat], [points[i].lon, points[i].lat], { units: 'meters' }),
      ).toBeGreaterThanOrEqual(2);
    }
    const events = await db('assignment_events').where({ assignment_id: job.jobId }).orderBy('at');
    const paused = events.find((e) => e.type === 'pause')!.at.getTime();
    const resumed = events.find((e) => e.type === 'resume')!.at.getTime();

    let row: { source_format: string; covered_acres: number } | undefined;
    for (let i = 0; i < 60 && !(row = await db('assignment_coverage').where({ assignment_id: job.jobId }).first()); i++)
      await new Promise((r) => setTimeout(r, 500));
    expect(row?.source_format).toBe('phone');
    // Independent overlay: each pass's points as a line, buffered by half the width, clipped to the field.
    const lines = [points.filter((p) => p.at.getTime() < paused), points.filter((p) => p.at.getTime() > resumed)].map((ps) =>
      turf.lineString(ps.map((p) => [p.lon, p.lat])),
    );
    const swath = turf.union(turf.featureCollection(lines.map((l) => turf.buffer(l, widthM / 2, { units: 'meters' })!)))!;
    const inField = turf.intersect(turf.featureCollection([turf.polygon(boundary.coordinates), swath]))!;
    const expected = turf.area(inField) / 4046.8564224;
    expect(Math.abs(row!.covered_acres - expected) / expected).toBeLessThan(0.02);

    // The owner opens the job's coverage from the board.
    const owner = await rig.newPage();
    await signIn(owner, demo('owner'));
    await owner.setViewportSize(PHONE);
    await owner.goto(`/board?date=${job.day}`);
    const card = owner.locator('app-assignment-card').filter({ hasText: job.fieldName });
    await card.getByRole('button', { name: new RegExp(`Coverage of ${job.fieldName}`) }).click();
    const dialog = await dialogOpen(owner);
    await dialog.locator('.covered-acres').waitFor();
    const summary = (await dialog.locator('.summary').textContent())?.replace(/\s+/g, ' ');
    expect(summary).toContain('(phone track)');
    expect(summary).toContain('every point taken while the job was underway counts as working');
    expect(await dialog.locator('app-field-map path[fill="#2b7bb9"]').count()).toBeGreaterThan(0);
    await screenshot(owner, 'run-sheet-phone-track-owner-coverage');
  }, 240_000);
});
