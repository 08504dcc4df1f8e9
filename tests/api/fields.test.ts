import type { BoundaryProblemCode } from '../../shared/geo/boundary-check';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { ACRE, rect, rectWithHole, referenceAreaM2, twoParts } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('fields', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  const fieldCount = async () => Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Fields');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
  });
  afterAll(() => t.close());

  it('when the owner saves a field with a hole, then its acres are the ellipsoidal area less the hole', async () => {
    const boundary = rectWithHole(-99.9, 47.6, 0.0107, 0.0072);
    const res = await owner.post('/api/fields', { name: 'Home Quarter', boundary });
    expect(res.status).toBe(201);
    // Reference: GeographicLib's planimeter run directly in the test, to 0.001 %.
    const want = referenceAreaM2(boundary) / ACRE;
    expect(Math.abs(res.body.acres - want) / want).toBeLessThan(1e-5);
    expect(res.body.boundary).toEqual(boundary);
    expect(res.body.hazards).toEqual({ type: 'FeatureCollection', features: [] });
    const list = await operator.get('/api/fields');
    const listed = list.body.find((f: { name: string }) => f.name === 'Home Quarter');
    expect(listed).toMatchObject({ hazardCount: 0 });
    // The list carries the acres as the field's own page does (to 0.0001), so the screen rounds
    // them once: a list rounded to 0.01 first turned 152.8468 into "152.9" beside "152.8" elsewhere.
    expect(listed.acres).toBe(res.body.acres);
    expect(Math.abs(listed.acres - want) / want).toBeLessThan(1e-5);
  });

  it('when a field has several parts, then their acres are added', async () => {
    const boundary = twoParts(-99.95, 47.62);
    const res = await owner.post('/api/fields', { name: 'Split Forty', boundary });
    expect(res.status).toBe(201);
    const want = referenceAreaM2(boundary) / ACRE;
    expect(Math.abs(res.body.acres - want) / want).toBeLessThan(1e-5);
  });

  it('when two fields would share a name (any case), then 409 and nothing is saved', async () => {
    const before = await fieldCount();
    const res = await owner.post('/api/fields', { name: 'home quarter', boundary: rect(-99.8, 47.6, 0.01, 0.01) });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already a field called "home quarter"/);
    expect(await fieldCount()).toBe(before);
  });

  const badBoundaries: Array<[string, unknown, RegExp, BoundaryProblemCode]> = [
    [
      'a self-intersecting ring (a bow tie)',
      {
        type: 'Polygon',
        coordinates: [
          [
            [-99.9, 47.6],
            [-99.89, 47.61],
            [-99.89, 47.6],
            [-99.9, 47.61],
            [-99.9, 47.6],
          ],
        ],
      },
      /crosses itself near 47\.605\d*° N, 99\.895\d*° W/,
      'self-intersection',
    ],
    [
      'a ring of three positions',
      {
        type: 'Polygon',
        coordinates: [
          [
            [-99.9, 47.6],
            [-99.89, 47.6],
            [-99.9, 47.6],
          ],
        ],
      },
      /has 3 positions; a closed ring needs at least 4/,
      'too-few-positions',
    ],
    [
      'a ring that is not closed',
      {
        type: 'Polygon',
        coordinates: [
          [
            [-99.9, 47.6],
            [-99.89, 47.6],
            [-99.89, 47.61],
            [-99.9, 47.61],
          ],
        ],
      },
      /not closed|does not end where it starts/i,
      'not-closed',
    ],
    [
      'a longitude beyond 180',
      {
        type: 'Polygon',
        coordinates: [
          [
            [-199.9, 47.6],
            [-99.89, 47.6],
            [-99.89, 47.61],
            [-199.9, 47.6],
          ],
        ],
      },
      /outside|range|180/i,
      'out-of-range',
    ],
    [
      'latitude and longitude swapped',
      { type: 'Polygon', coordinates: [rect(-99.9, 47.6, 0.01, 0.01).coordinates[0].map(([x, y]) => [y, x])] },
      /swapped/i,
      'swapped',
    ],
    ['a point where a boundary is expected', { type: 'Point', coordinates: [-99.9, 47.6] }, /Point/, 'not-polygon'],
  ];

  it.each(badBoundaries)(
    'when the boundary is %s, then 422 says what and where, and nothing is saved',
    async (_what, boundary, message, code) => {
      const before = await fieldCount();
      const res = await owner.post('/api/fields', { name: `Bad ${Math.random()}`, boundary });
      expect(res.status).toBe(422);
      expect(res.body.error.code).toBe('bad_boundary');
      expect(res.body.error.message).toMatch(message);
      // The problem's stable code (shared/geo/boundary-problem-codes), for clients that decide by it.
      expect(res.body.error.problems[0].code).toBe(code);
      expect(await fieldCount()).toBe(before);
    },
  );

  it('when the owner edits the boundary, then the acres are measured again', async () => {
    const created = await owner.post('/api/fields', { name: 'Grows', boundary: rect(-99.7, 47.6, 0.01, 0.01) });
    const bigger = rect(-99.7, 47.6, 0.02, 0.01);
    const res = await owner.patch(`/api/fields/${created.body.id}`, { boundary: bigger });
    expect(res.status).toBe(200);
    expect(res.body.acres).toBeCloseTo(referenceAreaM2(bigger) / ACRE, 3);
  });

  it('when the owner marks hazards, then they come back as GeoJSON features with kind, clearance and note', async () => {
    const f = await owner.post('/api/fields', { name: 'Bin Site', boundary: rect(-99.6, 47.6, 0.01, 0.01) });
    const bin = await owner.post(`/api/fields/${f.body.id}/hazards`, {
      kind: 'bin',
      geometry: { type: 'Point', coordinates: [-99.595, 47.605] },
      clearanceM: 15,
      note: 'Three bins and an auger',
    });
    expect(bin.status).toBe(201);
    const line = await owner.post(`/api/fields/${f.body.id}/hazards`, {
      kind: 'power',
      geometry: {
        type: 'LineString',
        coordinates: [
          [-99.6, 47.602],
          [-99.59, 47.602],
        ],
      },
      clearanceM: 10,
    });
    expect(line.status).toBe(201);
    const field = await operator.get(`/api/fields/${f.body.id}`);
    expect(field.body.hazards.features).toHaveLength(2);
    expect(field.body.hazards.features[0].properties).toMatchObject({ kind: 'bin', clearanceM: 15, note: 'Three bins and an auger' });
    const moved = await owner.patch(`/api/fields/${f.body.id}/hazards/${bin.body.id}`, { clearanceM: 20 });
    expect(moved.body.properties.clearanceM).toBe(20);
    expect((await owner.delete(`/api/fields/${f.body.id}/hazards/${line.body.id}`)).status).toBe(204);
    expect((await operator.get(`/api/fields/${f.body.id}`)).body.hazards.features).toHaveLength(1);
  });

  it('when a hazard is malformed, then 422 and nothing is saved', async () => {
    const f = await owner.post('/api/fields', { name: 'Rocky', boundary: rect(-99.5, 47.6, 0.01, 0.01) });
    const res = await owner.post(`/api/fields/${f.body.id}/hazards`, {
      kind: 'rock',
      geometry: { type: 'Point', coordinates: [-99.5, 147.6] },
      clearanceM: 3,
    });
    expect(res.status).toBe(422);
    const neg = await owner.post(`/api/fields/${f.body.id}/hazards`, {
      kind: 'rock',
      geometry: { type: 'Point', coordinates: [-99.5, 47.6] },
      clearanceM: -3,
    });
    expect(neg.status).toBe(400);
    expect(await t.db('hazards').where({ field_id: f.body.id }).count({ n: '*' })).toEqual([{ n: 0 }]);
  });

  it('when the owner plans crops and copies last season, then each field has its crop per season', async () => {
    const f = await owner.post('/api/fields', { name: 'Crop Test', boundary: rect(-99.4, 47.6, 0.01, 0.01) });
    expect((await owner.put(`/api/fields/${f.body.id}/crops/2025`, { crop: 'durum', varietyNote: 'certified seed' })).status).toBe(200);
    const copy = await owner.post('/api/crop-plans/2026/copy', { from: 2025 });
    expect(copy.body.copied).toBeGreaterThanOrEqual(1);
    const plans = await operator.get('/api/crop-plans/2026');
    expect(plans.body).toContainEqual({ fieldId: f.body.id, season: 2026, crop: 'durum', varietyNote: 'certified seed' });
    const list = await operator.get('/api/fields?season=2026');
    expect(list.body.find((x: { id: number }) => x.id === f.body.id).crop).toBe('durum');
  });

  it('when fields are exported, then a GeoJSON FeatureCollection holds each field and hazard', async () => {
    const res = await operator.get('/api/fields/export.geojson');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/geo\+json/);
    const fc = JSON.parse(res.text);
    expect(fc.type).toBe('FeatureCollection');
    const names = fc.features
      .filter((f: { properties: { type: string } }) => f.properties.type === 'field')
      .map((f: { properties: { name: string } }) => f.properties.name);
    expect(names).toEqual(expect.arrayContaining(['Home Quarter', 'Bin Site']));
    expect(
      fc.features.some(
        (f: { properties: { type: string; kind: string } }) => f.properties.type === 'hazard' && f.properties.kind === 'bin',
      ),
    ).toBe(true);
  });

  it('when the operator tries to change a field, then 403 and nothing changes', async () => {
    const list = await operator.get('/api/fields');
    const id = list.body[0].id;
    expect((await operator.patch(`/api/fields/${id}`, { name: 'Mine now' })).status).toBe(403);
    expect((await operator.delete(`/api/fields/${id}`)).status).toBe(403);
    expect((await t.db('fields').where({ id }).first()).name).toBe(list.body[0].name);
  });

  it('when the farm switches to metric, then every member sees it', async () => {
    const res = await owner.patch('/api/farm', { units: 'metric' });
    expect(res.body.units).toBe('metric');
    expect((await operator.get('/api/auth/me')).body.farm.units).toBe('metric');
    await owner.patch('/api/farm', { units: 'us' });
  });
});

describe('the last operation on each field', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('when jobs were finished on a field, then the list shows the latest one with its date', async () => {
    const farm = await makeFarm(t.db, 'LastOp');
    const owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    const field = (await owner.post('/api/fields', { name: 'Worked Field', boundary: rect(-99.9, 47.6, 0.01, 0.01) })).body;
    const idle = (await owner.post('/api/fields', { name: 'Idle Field', boundary: rect(-99.8, 47.6, 0.01, 0.01) })).body;
    const [machine] = await t
      .db('machines')
      .insert({ farm_id: farm.id, name: 'Tractor', kind: 'tractor-4wd', power_hp: 400 })
      .returning('id');
    const [implement] = await t
      .db('implements')
      .insert({ farm_id: farm.id, name: 'Harrow', kind: 'harrow', width_m: 25.6, operations: ['harrowing'] })
      .returning('id');
    const job = (day: string, operation: string, state: string) => ({
      farm_id: farm.id,
      day,
      field_id: field.id,
      operation,
      operator_id: farm.operator.membershipId,
      machine_id: machine.id,
      implement_id: implement.id,
      run_order: 1,
      state,
      acres_planned: 10,
      acres_done: state === 'finished' ? 10 : null,
    });
    await t
      .db('assignments')
      .insert([
        job('2026-04-20', 'harrowing', 'finished'),
        job('2026-05-02', 'seeding', 'finished'),
        job('2026-06-01', 'spraying', 'planned'),
      ]);
    const list = (await owner.get('/api/fields')).body;
    expect(list.find((f: { id: number }) => f.id === field.id).lastOperation).toEqual({ operation: 'seeding', date: '2026-05-02' });
    expect(list.find((f: { id: number }) => f.id === idle.id).lastOperation).toBeNull();
  });
});
