// "Where am I" on a job's map, on a 390×844 phone with the browser's geolocation emulated: the pass
// shown is the saved plan's pass under the phone (checked against the passes the server's saved plan
// gives, measured with @turf/turf), and inside a hazard's clearance zone the screen warns.
import * as turf from '@turf/turf';
import bcrypt from 'bcryptjs';
import type { FeatureCollection, LineString, Position } from 'geojson';
import type { Page } from 'playwright-core';
import type { PassProperties } from '../../shared/plan/types';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { demo, freeBoardDay, screenshot, seriousViolations, signIn, startRig, type BrowserRig } from '../support/browser';
import { rect } from '../support/geo-fixtures';
import { signedIn } from '../support/test-app';

const PHONE = { width: 390, height: 844 };
const WIDTH_M = 18.288; // a 60 ft implement
const POLE_CLEARANCE_M = 20;

describe('Where am I on the run sheet, in a real browser', () => {
  let rig: BrowserRig;
  let farmId = 0;
  let userId = 0;
  let fieldId = 0;
  let day = '';
  let passes: FeatureCollection<LineString, PassProperties>;
  const tag = Math.random().toString(36).slice(2, 8);
  const person = { role: 'operator' as const, name: `Ruth Calder ${tag}`, email: `ruth-${tag}@furlong.test`, password: 'where-am-i-pw' };
  const fieldName = `Position Test ${tag}`;
  // About 610 m × 445 m at 46.9° N; a power pole well inside, off the headland.
  const boundary = rect(-97.95, 46.9, 0.008, 0.004);
  const pole: Position = [-97.95 + 0.0055, 46.9 + 0.0013];

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    const farm = await db('farms').where({ name: DEMO_FARM_NAME }).first('id');
    farmId = farm.id;
    day = await freeBoardDay(rig);
    [{ id: userId }] = await db('users')
      .insert({ email: person.email, name: person.name, password_hash: bcrypt.hashSync(person.password, 4) })
      .returning('id');
    const [{ id: membershipId }] = await db('memberships')
      .insert({ farm_id: farmId, user_id: userId, role: 'operator', status: 'active', joined_at: db.fn.now() })
      .returning('id');
    [{ id: fieldId }] = await db('fields')
      .insert({ farm_id: farmId, name: fieldName, boundary: JSON.stringify(boundary), area_m2: 67 * 4046.86, acres: 67 })
      .returning('id');
    await db('hazards').insert({
      farm_id: farmId,
      field_id: fieldId,
      kind: 'power',
      geometry: JSON.stringify({ type: 'Point', coordinates: pole }),
      clearance_m: POLE_CLEARANCE_M,
      note: null,
      status: 'confirmed',
    });
    // The owner saves the plan the way the pass-plan screen does; auto heading.
    const owner = await signedIn(rig.t.app, demo('owner').email, demo('owner').password);
    const saved = await owner.put(`/api/plans/${fieldId}/harrowing`, { widthM: WIDTH_M, headlandPasses: 2, headingDeg: 'auto' });
    expect(saved.status).toBe(200);
    const geo = await owner.get(`/api/plans/${fieldId}/harrowing/passes.geojson`).buffer(true);
    passes = JSON.parse(geo.text) as FeatureCollection<LineString, PassProperties>;
    expect(passes.features.length).toBeGreaterThan(10);

    const machine = await db('machines').where({ farm_id: farmId }).first('id');
    const implement = await db('implements').where({ farm_id: farmId }).whereRaw("'harrowing' = any(operations)").first('id');
    if (!machine || !implement) throw new Error('The demo farm has no tractor or harrow: run scripts/prepare-db.ts --reset-demo');
    await db('board_days').insert({ farm_id: farmId, day, version: 1, published_at: db.fn.now() });
    await db('assignments').insert({
      farm_id: farmId,
      day,
      field_id: fieldId,
      operation: 'harrowing',
      operator_id: membershipId,
      machine_id: machine.id,
      implement_id: implement.id,
      run_order: 1,
      acres_planned: 67,
    });
  });
  afterAll(async () => {
    const db = rig.t.db;
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await db('pass_plans').where({ farm_id: farmId, field_id: fieldId }).delete();
    await db('hazards').where({ farm_id: farmId, field_id: fieldId }).delete();
    await db('fields').where({ farm_id: farmId, id: fieldId }).delete();
    await db('memberships').where({ farm_id: farmId, user_id: userId }).delete();
    await db('users').where({ id: userId }).delete();
    await rig.close();
  });

  /** The operator's run sheet on the phone, with location allowed for this site, standing at `at`. */
  async function phoneAt(at: Position): Promise<Page> {
    const page = await rig.newPage();
    await signIn(page, person);
    await page.setViewportSize(PHONE);
    const context = page.context();
    await context.grantPermissions(['geolocation'], { origin: rig.baseUrl });
    await context.setGeolocation({ longitude: at[0], latitude: at[1], accuracy: 5 });
    await page.goto(`/run-sheet?date=${day}`);
    const panel = page.locator('mat-expansion-panel').filter({ hasText: fieldName });
    await panel.waitFor();
    // The panel opens by itself when it is the day's only job; its map and aids load just after.
    const header = panel.locator('mat-expansion-panel-header');
    if ((await header.getAttribute('aria-expanded')) !== 'true') await header.click();
    await panel.locator('app-job-position').waitFor();
    return page;
  }

  it('when the phone stands 8 m from the power pole (20 m clearance), then the screen warns that it is inside the clearance zone, and says it is an aid', async () => {
    const at = turf.destination(pole, 8, 250, { units: 'meters' }).geometry.coordinates;
    const page = await phoneAt(at);
    // Nothing is asked of the phone before the tap.
    await page
      .getByText("An aid only: the tractor's own display and your own eyes come first. Do not handle the phone while driving.")
      .waitFor();
    expect(await page.locator('.zone-warning').count()).toBe(0);
    await page.getByRole('button', { name: 'Show where I am' }).click();
    const warning = page.locator('.zone-warning[role="alert"]');
    await warning.waitFor();
    expect((await warning.textContent())?.replace(/\s+/g, ' ')).toContain(
      'Inside the clearance zone of the power pole or line. Keep 66 ft clear',
    );
    // Passes stop at the zone's edge: none is under the phone, and the line says why.
    await page
      .locator('.pass[data-under="false"]')
      .getByText(/^In a clearance zone; nearest pass \d+ of \d+/)
      .waitFor();
    await page.locator('.jp-position').waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await page.locator('app-job-position').scrollIntoViewIfNeeded();
    await screenshot(page, 'run-sheet-position-in-zone');
  });

  it('when the phone is on a pass, a third of a width off its centre line, then the pass number shown is the saved plan’s pass under that point', async () => {
    // A pass in the middle of the plan, half way along: the point is placed with turf, and the pass
    // under it found again with turf's distances to every pass line of the server's saved plan.
    const line = [...passes.features].sort((a, b) => a.properties.pass - b.properties.pass)[Math.floor(passes.features.length / 2)];
    const middle = turf.along(line, line.properties.lengthM / 2, { units: 'meters' });
    const at = turf.destination(middle, WIDTH_M / 3, line.properties.headingDeg + 90, { units: 'meters' }).geometry.coordinates;
    const byDistance = passes.features
      .map((f) => ({ pass: f.properties.pass, d: turf.pointToLineDistance(at, f, { units: 'meters' }) }))
      .sort((a, b) => a.d - b.d);
    expect(byDistance[0].d).toBeLessThan(WIDTH_M / 2);
    expect(byDistance[1].d).toBeGreaterThan(WIDTH_M / 2);
    const expected = byDistance[0].pass;
    const count = Math.max(...passes.features.map((f) => f.properties.pass));

    const page = await phoneAt(at);
    // Before any position: the saved plan on the job's map, worked out on the phone, one line for
    // each pass segment of the server's own plan, and the headland shaded.
    await page.locator('[data-plan-on-map]').getByText(`On the map: the saved plan’s ${count} passes (grey lines)`).waitFor();
    expect(await page.locator('path.jp-plan-pass').count()).toBe(passes.features.length);
    await page.getByRole('button', { name: 'Show where I am' }).click();
    const shown = page.locator('.pass[data-under="true"]');
    await shown.waitFor();
    expect(await shown.getAttribute('data-pass')).toBe(String(expected));
    expect((await shown.textContent())?.trim()).toBe(`Pass ${expected} of ${count}`);
    expect(await page.locator('.zone-warning').count()).toBe(0);
    await page.locator('.next-zone').getByText('Power pole or line').waitFor();

    // Moving 30 m along the pass gives a heading, the pass's own (within 1°, the emulated fixes are exact).
    const ahead = turf.destination(at, 30, line.properties.headingDeg, { units: 'meters' }).geometry.coordinates;
    await page.context().setGeolocation({ longitude: ahead[0], latitude: ahead[1], accuracy: 5 });
    await page.locator('.heading').filter({ hasText: '°' }).waitFor();
    const heading = Number((await page.locator('.heading').textContent())!.replace('°', '').trim());
    expect(Math.abs(((heading - line.properties.headingDeg + 540) % 360) - 180)).toBeLessThanOrEqual(1);
    await page.locator('.jp-arrow').waitFor();
    await page.locator('app-job-position').scrollIntoViewIfNeeded();
    await screenshot(page, 'run-sheet-position-on-pass');
    expect(rig.outside).toEqual([]);
  });
});
