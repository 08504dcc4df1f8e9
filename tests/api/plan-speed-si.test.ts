import { ftToM, mphToMps } from '../../shared/units';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

// A plan's working speed is stored in metres per second, like its width in metres; the screens
// show mph or km/h. Outside reference for every conversion here: 1 mile = 1,609.344 m exactly
// (NIST Handbook 44, Appendix C), so 1 mph = 0.447 04 m/s and 5.5 mph = 2.458 72 m/s.
describe('a pass plan keeps its speed in SI', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  let fieldId: number;
  const boundary = rect(-99.9, 47.6, 0.0107, 0.0072); // about a quarter section (invented)

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Plan speed SI');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    fieldId = (await owner.post('/api/fields', { name: 'Speed Quarter', boundary })).body.id;
  });
  afterAll(() => t.close());

  const row = () => t.db('pass_plans').where({ farm_id: farm.id, field_id: fieldId, operation: 'harrowing' }).first();

  it('when a plan is saved on an imperial farm at 5.5 mph and the farm switches to metric and back, then its speed and hours never change', async () => {
    expect((await owner.get('/api/farm')).body.units).toBe('us');
    // What the Pass plan form sends for 60 ft and 5.5 mph typed on an imperial farm.
    const body = { widthM: ftToM(60), speedMps: mphToMps(5.5), headingDeg: 90, headlandPasses: 1, implementKind: 'harrow' };
    const put = await owner.put(`/api/plans/${fieldId}/harrowing`, body);
    expect(put.status).toBe(200);
    expect(put.body.speedMps).toBeCloseTo(2.45872, 12);
    expect(put.body.summary.speedMps).toBe(put.body.speedMps);
    const stored = await row();
    expect(stored.speed_mps).toBeCloseTo(2.45872, 12);
    // Hours = distance ÷ speed + turns × turn time (the planner's definition, turn time 20 s).
    const s = put.body.summary;
    expect(s.hours).toBeCloseTo((s.totalDistanceM / 2.45872 + s.turns * 20) / 3600, 9);
    const before = { speedMps: put.body.speedMps, hours: s.hours, capacity: s.capacityAcresPerHour };

    for (const units of ['metric', 'us'] as const) {
      expect((await owner.patch('/api/farm', { units })).status).toBe(200);
      const got = await owner.get(`/api/plans/${fieldId}/harrowing`);
      expect(got.status).toBe(200);
      expect({ speedMps: got.body.speedMps, hours: got.body.summary.hours, capacity: got.body.summary.capacityAcresPerHour }).toEqual(
        before,
      );
      // The form sends back the stored speed while its box still shows it (plan-settings.spec.ts):
      // saving again in these units writes the very same figures.
      const again = await owner.put(`/api/plans/${fieldId}/harrowing`, { ...body, speedMps: got.body.speedMps });
      expect({ speedMps: again.body.speedMps, hours: again.body.summary.hours }).toEqual({
        speedMps: before.speedMps,
        hours: before.hours,
      });
      expect((await row()).speed_mps).toBe(stored.speed_mps);
    }
  });

  it('when an older client sends the speed in mph, then it is converted exactly and the plan keeps it', async () => {
    const put = await owner.put(`/api/plans/${fieldId}/harrowing`, { widthM: ftToM(60), speedMph: 5.5, headingDeg: 90, headlandPasses: 1 });
    expect(put.status).toBe(200);
    expect(put.body.speedMps).toBe(mphToMps(5.5));
    expect(put.body).not.toHaveProperty('speedMph');
    expect((await row()).speed_mps).toBe(mphToMps(5.5));
  });

  it('when both speeds are sent, or a speed over 60 mph, then 400 says why and the saved plan stays', async () => {
    const before = await row();
    const both = await owner.put(`/api/plans/${fieldId}/harrowing`, { widthM: 18.288, speedMps: 2, speedMph: 5 });
    expect(both.status).toBe(400);
    expect(both.body.error.message).toMatch(/Send the speed once/);
    // 60 mph = 26.8224 m/s; 27 m/s is just over.
    const fast = await owner.put(`/api/plans/${fieldId}/harrowing`, { widthM: 18.288, speedMps: 27 });
    expect(fast.status).toBe(400);
    expect(fast.body.error.fields.speedMps).toBe('The speed is at most 60 mph (97 km/h)');
    expect(await row()).toEqual(before);
  });
});
