import { planPasses } from '../../shared/plan/plan-passes';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('pass plans over the API', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;
  let fieldId: number;
  const boundary = rect(-99.9, 47.6, 0.0107, 0.0072); // about a quarter section (invented)

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Plans');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    operator = new Client(t.app);
    await operator.signIn(farm.operator.email, farm.operator.password);
    fieldId = (await owner.post('/api/fields', { name: 'Plan Quarter', boundary })).body.id;
    await owner.post(`/api/fields/${fieldId}/hazards`, {
      kind: 'bin',
      geometry: { type: 'Point', coordinates: [-99.895, 47.6036] },
      clearanceM: 20,
    });
  });
  afterAll(() => t.close());

  it('when any member previews a plan for a field, then the figures are those of the shared planner with the field and its hazards', async () => {
    const res = await operator.post('/api/plans/preview', { fieldId, widthM: 18.288, headingDeg: 0, operation: 'seeding' });
    expect(res.status).toBe(200);
    const field = (await operator.get(`/api/fields/${fieldId}`)).body;
    const direct = planPasses({ boundary, hazards: field.hazards, widthM: 18.288, headingDeg: 0, coverage: 'full' });
    expect(res.body.coverage).toBe('full'); // seeding must leave no skip
    expect(res.body.passCount).toBe(direct.passCount);
    expect(res.body.segmentCount).toBe(direct.segmentCount);
    expect(res.body.workedAcres).toBeCloseTo(direct.workedAcres, 6);
    expect(res.body.passes.features.length).toBe(direct.segmentCount);
    expect(res.body.hazardZones).not.toBeNull();
  });

  it('when a boundary is posted instead of a field, then it is planned too', async () => {
    const res = await operator.post('/api/plans/preview', { boundary, widthM: 25.6, headingDeg: 'auto' });
    expect(res.status).toBe(200);
    expect(res.body.headingDeg).toBeGreaterThanOrEqual(0);
    expect(res.body.turns).toBe(res.body.segmentCount - 1);
  });

  it('when the owner saves a plan, then the operator reads it back and can export the passes as GeoJSON', async () => {
    const put = await owner.put(`/api/plans/${fieldId}/harrowing`, {
      widthM: 25.6032,
      headingDeg: 90,
      headlandPasses: 1,
      implementKind: 'harrow',
    });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ fieldId, operation: 'harrowing', headingDeg: 90, headlandPasses: 1, coverage: 'gaps-ok' });
    const got = await operator.get(`/api/plans/${fieldId}/harrowing`);
    expect(got.body.summary.passCount).toBe(put.body.summary.passCount);
    expect(got.body.result.passes.features.length).toBe(got.body.summary.segmentCount);
    const list = await operator.get(`/api/plans?fieldId=${fieldId}`);
    expect(list.body.map((p: { operation: string }) => p.operation)).toEqual(['harrowing']);
    const geo = await operator.get(`/api/plans/${fieldId}/harrowing/passes.geojson`);
    expect(geo.headers['content-type']).toMatch(/geo\+json/);
    const fc = JSON.parse(geo.text);
    expect(fc.features[0].geometry.type).toBe('LineString');
    expect(fc.features[0].properties).toMatchObject({ pass: 1, headingDeg: 90, field: 'Plan Quarter', operation: 'harrowing' });
    const passNumbers = fc.features.map((f: { properties: { pass: number } }) => f.properties.pass);
    expect(Math.max(...passNumbers)).toBe(put.body.summary.passCount);
  });

  it('when a hazard is added after a saved plan was read, then the next read plans around it', async () => {
    const put = await owner.put(`/api/plans/${fieldId}/swathing`, { widthM: 18.288, headingDeg: 0, headlandPasses: 1 });
    expect(put.status).toBe(200);
    const before = await operator.get(`/api/plans/${fieldId}/swathing`);
    const again = await operator.get(`/api/plans/${fieldId}/swathing`);
    expect(again.body.result.workRegionAcres).toBe(before.body.result.workRegionAcres);
    const slough = rect(-99.896, 47.602, 0.001, 0.001);
    expect((await owner.post(`/api/fields/${fieldId}/hazards`, { kind: 'waterway', geometry: slough, clearanceM: 5 })).status).toBe(201);
    const after = await operator.get(`/api/plans/${fieldId}/swathing`);
    expect(after.body.result.workRegionAcres).toBeLessThan(before.body.result.workRegionAcres - 1);
  });

  it('when the operator tries to save a plan, then 403 and nothing is stored', async () => {
    const res = await operator.put(`/api/plans/${fieldId}/seeding`, { widthM: 18 });
    expect(res.status).toBe(403);
    expect(await t.db('pass_plans').where({ field_id: fieldId, operation: 'seeding' }).first()).toBeUndefined();
  });

  const bad: Array<[string, object, number, RegExp]> = [
    ['a zero width', { widthM: 0 }, 400, /greater than zero/],
    ['a negative width', { widthM: -5 }, 400, /greater than zero/],
    ['a heading of 180', { widthM: 18, headingDeg: 180 }, 400, /0 to 179°/],
    ['an edge margin of 50 %', { widthM: 18, edgeMarginPct: 50 }, 400, /0 to 25 %/],
    ['a width wider than the field', { widthM: 80, fieldId: undefined, boundary: rect(-99.9, 47.6, 0.0005, 0.0005) }, 422, /wider than/],
    ['a headland that erases the field', { widthM: 60, headlandPasses: 10 }, 422, /leaves nothing/],
  ];
  it.each(bad)('when the settings have %s, then a clear %s message and no NaN', async (_what, settings, status, message) => {
    const res = await owner.post('/api/plans/preview', { fieldId, ...settings });
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(message);
    expect(JSON.stringify(res.body)).not.toMatch(/NaN|null,"stack"/);
  });

  it('when a setting is refused, then its message is under the key the form maps to a label, without the key in the words', async () => {
    const res = await owner.put(`/api/plans/${fieldId}/seeding`, { widthM: 18.288, headingDeg: 200 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ headingDeg: 'Enter a heading from 0 to 179°' });
    expect(res.body.error.fields.headingDeg).not.toMatch(/headingDeg/);
  });

  it('when the chosen implement is not in the farm fleet, then 422 marks the implement and nothing is stored', async () => {
    const other = await makeFarm(t.db, 'Plans other');
    const stranger = new Client(t.app);
    await stranger.signIn(other.owner.email, other.owner.password);
    const theirs = await stranger.post('/api/fleet/implements', {
      name: 'Borrowed Drill',
      kind: 'air-drill',
      widthM: 12.192,
      operations: ['seeding'],
    });
    expect(theirs.status).toBe(201);
    const res = await owner.put(`/api/plans/${fieldId}/seeding`, { widthM: 12.192, implementId: theirs.body.id });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields)).toEqual(['implementId']);
    expect(await t.db('pass_plans').where({ field_id: fieldId, operation: 'seeding' }).first()).toBeUndefined();
  });

  it('when a plan is saved at a width other than its implement, then the saved plan gives both widths', async () => {
    // 70 ft harrow = 21.336 m, planned at 60 ft = 18.288 m (1 ft = 0.3048 m exactly, 85 FR 62698).
    const harrow = await owner.post('/api/fleet/implements', {
      name: 'Seventy Harrow',
      kind: 'harrow',
      widthM: 21.336,
      operations: ['harrowing'],
    });
    expect(harrow.status).toBe(201);
    const put = await owner.put(`/api/plans/${fieldId}/harrowing`, { widthM: 18.288, implementId: harrow.body.id, headingDeg: 0 });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({
      widthM: 18.288,
      implementId: harrow.body.id,
      implementName: 'Seventy Harrow',
      implementWidthM: 21.336,
    });
    const listed = (await operator.get(`/api/plans?fieldId=${fieldId}`)).body.find(
      (p: { operation: string }) => p.operation === 'harrowing',
    );
    expect(listed).toMatchObject({ widthM: 18.288, implementWidthM: 21.336 });
  });

  it('when auto heading plans a square section crossed by a coulee, then the passes run along an edge and the best headings are offered', async () => {
    // A mile square (invented, 47.55° N) with a coulee bank slanting across it: fewest turns ran the
    // passes at about 80°; within 3 % of the fastest time an edge heading is preferred (common
    // practice: passes along the fence line; no published source).
    const section = rect(-99.95, 47.55, 0.02142, 0.01449);
    const at = (fx: number, fy: number) => [-99.95 + fx * 0.02142, 47.55 + fy * 0.01449];
    const hazards = {
      type: 'FeatureCollection',
      features: [
        {
          type: 'Feature',
          properties: { clearanceM: 12 },
          geometry: { type: 'LineString', coordinates: [at(0, 0.4), at(0.4, 0.5), at(0.7, 0.7), at(1, 0.75)] },
        },
      ],
    };
    const res = await owner.post('/api/plans/preview', { boundary: section, hazards, widthM: 18.288 });
    expect(res.status).toBe(200);
    // Meridians converge a few thousandths of a degree across a section: "along an edge" is to 0.05°.
    const h = res.body.headingDeg as number;
    expect(Math.min(h, Math.abs(h - 90), 180 - h)).toBeLessThan(0.05);
    const candidates = res.body.headingCandidates as Array<{ headingDeg: number; hours: number; passCount: number; turns: number }>;
    expect(candidates.length).toBeGreaterThanOrEqual(2);
    expect(candidates.length).toBeLessThanOrEqual(3);
    expect(candidates[0]).toMatchObject({ headingDeg: res.body.headingDeg, passCount: res.body.passCount, turns: res.body.turns });
    for (const c of candidates) expect(res.body.hours).toBeLessThanOrEqual(c.hours * 1.03 + 1e-9);
    expect(res.body.edgeMarginPct).toBe(3);
  });

  it('when an unknown operation is asked for, then 400 lists the operations', async () => {
    const res = await operator.get(`/api/plans/${fieldId}/ploughing`);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/harrowing, tillage, seeding/);
  });
});
