// The owner attaches a GPX track to a finished seeding job from the work board on a desktop: the
// dialog measures it, shows the covered acres, draws the covered ground and the skip on the map
// with its key, flags the skip (seeding must cover everything), and the job now counts the
// measured acres beside the typed ones.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { DEMO_FARM_NAME } from '../../seeds/01_demo_farm';
import { localProjection, projectionForField } from '../../shared/geo/local-projection';
import { geodesicAreaM2 } from '../../shared/geo/geodesic-area';
import { m2ToAcres } from '../../shared/units';
import { demo, freeBoardDay, screenshot, signIn, startRig, type BrowserRig, openedDialog } from '../support/browser';

// A 200 m × 300 m field and a 20 m drill: passes at x = −90, −70, −30, −10, 10, 30, 50, 70, 90 m
// leave out the pass at x = −50, one skip of 20 × 300 m (by hand); covered 9 × 20 × 300 m.
const WIDTH = 20;
const XS = [-90, -70, -30, -10, 10, 30, 50, 70, 90];
const centre = localProjection([-97.7, 46.7]);
const ring = [
  [-100, -150],
  [100, -150],
  [100, 150],
  [-100, 150],
  [-100, -150],
].map((p) => centre.inverse(p));
const boundary = { type: 'Polygon' as const, coordinates: [ring] };
const proj = projectionForField(boundary);

function gpx(): string {
  const segs = XS.map((x, k) => {
    const pts = Array.from({ length: 33 }, (_, i) => {
      const y = k % 2 === 0 ? -160 + 10 * i : 160 - 10 * i;
      const [lon, lat] = proj.inverse([x, y]);
      return `<trkpt lat="${lat.toFixed(9)}" lon="${lon.toFixed(9)}"/>`;
    });
    return `<trkseg>${pts.join('')}</trkseg>`;
  });
  return `<?xml version="1.0" encoding="UTF-8"?><gpx version="1.1" creator="Tamarack Ridge test" xmlns="http://www.topografix.com/GPX/1/1"><trk><name>Seeding</name>${segs.join('')}</trk></gpx>`;
}

describe('The owner attaches a track to a finished seeding job in a real browser', () => {
  let rig: BrowserRig;
  let farmId = 0;
  let fieldId = 0;
  let jobId = 0;
  let implementId = 0;
  let day = '';
  const tag = Math.random().toString(36).slice(2, 8);
  const fieldName = `Coverage ${tag}`;
  const file = path.join(os.tmpdir(), `seeding-${tag}.gpx`);

  beforeAll(async () => {
    rig = await startRig();
    const db = rig.t.db;
    farmId = (await db('farms').where({ name: DEMO_FARM_NAME }).first('id')).id;
    day = await freeBoardDay(rig, [4, 5]);
    const area = geodesicAreaM2(boundary);
    [{ id: fieldId }] = await db('fields')
      .insert({ farm_id: farmId, name: fieldName, boundary: JSON.stringify(boundary), area_m2: area, acres: m2ToAcres(area) })
      .returning('id');
    [{ id: implementId }] = await db('implements')
      .insert({ farm_id: farmId, name: `Drill ${tag}`, kind: 'air-drill', width_m: WIDTH, operations: ['seeding'] })
      .returning('id');
    const machine = await db('machines').where({ farm_id: farmId }).first('id');
    const operator = await db('memberships').where({ farm_id: farmId, role: 'operator', status: 'active' }).first('id');
    await db('board_days').insert({ farm_id: farmId, day, version: 1, published_at: db.fn.now() });
    [{ id: jobId }] = await db('assignments')
      .insert({
        farm_id: farmId,
        day,
        field_id: fieldId,
        operation: 'seeding',
        operator_id: operator.id,
        machine_id: machine.id,
        implement_id: implementId,
        run_order: 1,
        acres_planned: 14,
        state: 'finished',
        started_at: `${day}T13:00:00Z`,
        finished_at: `${day}T17:00:00Z`,
        acres_done: 14,
        acres_typed: 14,
        acres_source: 'typed',
        hours_worked: 4,
      })
      .returning('id');
    fs.writeFileSync(file, gpx());
  });
  afterAll(async () => {
    const db = rig.t.db;
    await db('assignment_events').where({ farm_id: farmId, assignment_id: jobId }).delete();
    await db('assignment_coverage').where({ farm_id: farmId, assignment_id: jobId }).delete();
    await db('assignments').where({ farm_id: farmId, day }).delete();
    await db('board_changes').where({ farm_id: farmId, day }).delete();
    await db('board_days').where({ farm_id: farmId, day }).delete();
    await db('fields').where({ farm_id: farmId, id: fieldId }).delete();
    await db('implements').where({ farm_id: farmId, id: implementId }).delete();
    fs.rmSync(file, { force: true });
    await rig.close();
  });

  it('when the owner sends a GPX from the board, then the covered acres show and the coverage and the skip are drawn with a key', async () => {
    const page = await rig.newPage();
    await signIn(page, demo('owner'));
    await page.goto(`/board?date=${day}`);
    const card = page.locator('app-assignment-card').filter({ hasText: fieldName });
    await card.getByRole('button', { name: `Coverage of ${fieldName} seeding` }).click();
    const dialog = await openedDialog(page);
    await dialog.getByText('No track measured for this job yet.').waitFor();
    await dialog.locator('input[type=file]').setInputFiles(file);
    const covered = dialog.locator('.covered-acres');
    await covered.waitFor();

    // Hand: 9 passes × 20 m × 300 m covered; the missing pass leaves one skip of 20 × 300 m (acres to one decimal, as the screen shows).
    expect(await covered.textContent()).toBe(`${m2ToAcres(9 * WIDTH * 300).toFixed(1)} ac`);
    const key = await dialog.getByRole('list', { name: 'Map key: coverage' }).locator('li').allTextContents();
    expect(key.map((k) => k.replace(/\s+/g, ' ').trim())).toEqual([
      `Covered ${m2ToAcres(9 * WIDTH * 300).toFixed(1)} ac`,
      'Worked twice 0.0 ac',
      `Skipped ${m2ToAcres(WIDTH * 300).toFixed(1)} ac`,
    ]);
    await dialog.getByText(`1 skip left unworked, ${m2ToAcres(WIDTH * 300).toFixed(1)} ac in all`).waitFor();
    await dialog.getByText(/The job counts the measured [\d.]+ ac; typed at the finish: 14\.0 ac\./).waitFor();
    // Drawn: the covered ground and the dashed skip, in their own colours (shared/map/coverage-layers.ts).
    const map = dialog.locator('app-field-map');
    expect(await map.locator('path[fill="#2b7bb9"]').count()).toBeGreaterThan(0);
    expect(await map.locator('path[stroke="#c8326e"][stroke-dasharray]').count()).toBeGreaterThan(0);
    // Neighbouring passes exactly one width apart only touch: no ground worked twice is drawn.
    expect(await map.locator('path[fill="#c05a00"]').count()).toBe(0);
    await screenshot(page, 'board-job-coverage');

    const row = await rig.t.db('assignments').where({ farm_id: farmId, day, id: jobId }).first('acres_done', 'acres_typed', 'acres_source');
    expect(row).toMatchObject({ acres_typed: 14, acres_source: 'measured' });
    expect(row.acres_done).toBeCloseTo(m2ToAcres(9 * WIDTH * 300), 1);
  });
});
