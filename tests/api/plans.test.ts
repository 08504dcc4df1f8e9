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
    ['a heading of 180', { widthM: 18, headingDeg: 180 }, 400, /0° to 179°/],
    ['a width wider than the field', { widthM: 80, fieldId: undefined, boundary: rect(-99.9, 47.6, 0.0005, 0.0005) }, 422, /wider than/],
    ['a headland that erases the field', { widthM: 60, headlandPasses: 10 }, 422, /leaves nothing/],
  ];
  it.each(bad)('when the settings have %s, then a clear %s message and no NaN', async (_what, settings, status, message) => {
    const res = await owner.post('/api/plans/preview', { fieldId, ...settings });
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(message);
    expect(JSON.stringify(res.body)).not.toMatch(/NaN|null,"stack"/);
  });

  it('when an unknown operation is asked for, then 400 lists the operations', async () => {
    const res = await operator.get(`/api/plans/${fieldId}/ploughing`);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/harrowing, tillage, seeding/);
  });
});
