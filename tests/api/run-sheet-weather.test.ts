// The run sheet's weather: each job's hours from the stored forecast (the fake forecast server's
// scenarios, stored through the real client), and a call-off for weather keeping the forecast's
// issue time, hour and reason, read on the server from the stored forecast.
import type { RunSheet } from '../../shared/schemas/run-sheet';
import type { FieldForecast } from '../../shared/schemas/weather';
import { refreshFarmWeather } from '../../server/weather/weather.service';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';
import { effectiveCapacityAcPerH } from '../../shared/plan/field-capacity';
import { implementDefaults } from '../../shared/plan/implement-defaults';
import { mpsToMph } from '../../shared/units';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
  t.weather.mode = 'ok';
  t.weather.scenario = 'windy-afternoon';
  t.weather.now = NOW;
});
afterAll(() => t.close());

/** The fake's scenario hours start at midnight UTC of this day (May: the farm, America/Chicago, is UTC−5). */
const NOW = new Date('2026-05-14T15:30:00Z');
const DAY = '2026-05-14';
/** Forecasts are fetched on the real clock, which the age and stale checks read. */
const fetchedNow = () => new Date(Math.floor(Date.now() / 60_000) * 60_000);

interface Setup {
  farm: TestFarm;
  owner: Client;
  operator: Client;
  fieldId: number;
  spray: number;
}

const SPRAY_TIMES = { startTime: '10:00', endTime: '16:00' };

/** A farm (US units, America/Chicago) with a field near −101.5°, and a spraying job 10:00–16:00 on its operator's sheet. */
async function setUp(
  label: string,
  times: { startTime: string; endTime: string | null; acresPlanned?: number } = SPRAY_TIMES,
): Promise<Setup> {
  const farm = await makeFarm(t.db, label);
  await t.db('farms').where({ id: farm.id }).update({ time_zone: 'America/Chicago', units: 'us', day_hours_limit: 12 });
  const owner = new Client(t.app);
  await owner.signIn(farm.owner.email, farm.owner.password);
  const operator = new Client(t.app);
  await operator.signIn(farm.operator.email, farm.operator.password);
  const [f] = await t
    .db('fields')
    .insert({
      farm_id: farm.id,
      name: 'Coulee quarter',
      boundary: JSON.stringify(rect(-101.512, 50.098, 0.004, 0.003)),
      area_m2: 80_000,
      acres: 19.77,
    })
    .returning('id');
  await t
    .db('crew_skills')
    .insert({ farm_id: farm.id, membership_id: farm.operator.membershipId, operation: 'spraying', level: 'qualified' });
  const sprayer = await insertImplement(t.db, farm.id, { kind: 'sprayer', operations: ['spraying'], width_m: 36.576 });
  const tractor = await insertMachine(t.db, farm.id, { power_hp: 450 });
  const version = (await owner.get(`/api/board?date=${DAY}`)).body.version;
  const res = await owner.post('/api/assignments', {
    version,
    date: DAY,
    fieldId: f.id,
    operatorId: farm.operator.membershipId,
    machineId: tractor,
    implementId: sprayer,
    operation: 'spraying',
    ...times,
  });
  expect(res.status).toBe(201);
  return { farm, owner, operator, fieldId: f.id as number, spray: res.body.savedAssignmentId as number };
}

const sheetOf = async (c: Client): Promise<RunSheet> => {
  const res = await c.get(`/api/run-sheet?date=${DAY}`);
  expect(res.status).toBe(200);
  return res.body as RunSheet;
};

// The scenario's afternoon wind, 30 km/h, starts at 12:00 by the sun: 14:00 at the farm (UTC−5, −101.5° → sun 1.77 h behind the
// clock). 30 km/h ÷ 1.609344 km/h per mile (international mile, 1959 yard and pound agreement) = 18.6 mph, over the 10 mph label
// window (National Pesticide Stewardship Alliance, "Evaluate the Weather").
const WINDY_REASON = 'wind 18.6 mph at 14:00, above the spraying limit of 10.0 mph';

describe('run sheet weather', () => {
  let s: Setup;
  beforeAll(async () => {
    s = await setUp('Sheet weather');
    expect(await refreshFarmWeather(t.db, s.farm.id, { url: t.weather.url, now: fetchedNow() })).toMatchObject({ refreshed: 1, failed: 0 });
  });

  it('when the windy afternoon is stored, then the job shows the hours of its window with wind, rain, Delta T and the spraying verdict', async () => {
    const job = (await sheetOf(s.operator)).assignments.find((a) => a.id === s.spray)!;
    const w = job.weather!;
    expect(w).toMatchObject({ over: 'job', from: '10:00', to: '16:00', stale: false });
    expect(w.ageMinutes).toBeLessThanOrEqual(2);
    // 10:00 … 15:00: the window's end hour is not shown (as on the board).
    expect(w.hours.map((h) => h.time)).toEqual(['10', '11', '12', '13', '14', '15'].map((h) => `${DAY}T${h}:00:00-05:00`));
    const at14 = w.hours[4];
    // 30 km/h as sent by the fake, stored in m/s and read back in km/h (× 3.6, SI definition of the km/h).
    expect(at14.windSpeedKmh).toBeCloseTo(30, 1);
    expect(at14.verdict).toMatchObject({ verdict: 'no-go' });
    expect(at14.verdict!.reasons[0]).toBe(WINDY_REASON);
    expect(at14.deltaTC).not.toBeNull();
    expect(w.verdict!.verdict).toBe('no-go');
    expect(w.verdict!.reasons[0]).toBe(WINDY_REASON);
    // The same hours as the field's forecast answers them.
    const forecast = (await s.operator.get(`/api/weather/fields/${s.fieldId}`)).body as FieldForecast;
    const same = forecast.hours.find((h) => h.time === at14.time)!;
    expect(at14).toEqual({
      time: same.time,
      temperatureC: same.temperatureC,
      windSpeedKmh: same.windSpeedKmh,
      windGustKmh: same.windGustKmh,
      windDirectionDeg: same.windDirectionDeg,
      precipitationMm: same.precipitationMm,
      precipitationProbabilityPct: same.precipitationProbabilityPct,
      deltaTC: same.deltaTC,
      verdict: same.verdicts.spraying,
    });
    expect(w.issuedAt).toBe(forecast.issuedAt);
  });

  it('when the operator calls the job off for weather, then the log keeps the forecast issue time, the hour and its first reason from the stored forecast, not what the phone sent', async () => {
    const res = await s.operator.post(`/api/assignments/${s.spray}/events`, {
      type: 'call-off',
      reason: 'weather',
      at: '2026-05-14T15:05:00Z',
      // Not part of the request's schema: ignored, the server reads the forecast itself.
      weather: { hour: '2026-05-14T10:00:00-05:00', reason: 'sent by the phone' },
    });
    expect(res.status).toBe(201);
    const stored = await t.db('weather_forecasts').where({ farm_id: s.farm.id }).orderBy('issued_at', 'desc').first();
    const entry = res.body.events.find((e: { type: string }) => e.type === 'call-off');
    // Called off at 10:05: the window's worst hour from then on is the first windy one.
    expect(entry.weather).toEqual({
      issuedAt: stored.issued_at.toISOString(),
      hour: `${DAY}T14:00:00-05:00`,
      verdict: 'no-go',
      reason: WINDY_REASON,
    });
    const row = await t.db('assignment_events').where({ id: entry.id }).first();
    expect(row.weather_hour.toISOString()).toBe('2026-05-14T19:00:00.000Z');
    expect(row.weather_reason).toBe(WINDY_REASON);
    // The run sheet shows it with the log.
    const again = (await sheetOf(s.operator)).assignments.find((a) => a.id === s.spray)!;
    expect(again.events.find((e) => e.id === entry.id)!.weather).toEqual(entry.weather);
  });
});

describe('run sheet weather of a job given only a start', () => {
  let s: Setup;
  beforeAll(async () => {
    // Acres for 4 h of spraying at the 120 ft boom's effective field capacity (width × speed × efficiency ÷ 8.25,
    // ASABE EP496 / Iowa State AEN-73), so the job runs 08:00–12:00 with no end time set.
    const d = implementDefaults('sprayer');
    const acresPlanned = Math.round(4 * effectiveCapacityAcPerH(120, mpsToMph(d.speedMps), d.efficiency) * 100) / 100;
    s = await setUp('Sheet weather start only', { startTime: '08:00', endTime: null, acresPlanned });
    expect(await refreshFarmWeather(t.db, s.farm.id, { url: t.weather.url, now: fetchedNow() })).toMatchObject({ refreshed: 1, failed: 0 });
  });

  it('when a job starts at 08:00 and runs 4 h, then its weather is over 08:00–12:00 (its own hours), not the working day', async () => {
    const job = (await sheetOf(s.operator)).assignments.find((a) => a.id === s.spray)!;
    expect([job.startTime, job.endTime]).toEqual(['08:00', '12:00']);
    const w = job.weather!;
    expect(w).toMatchObject({ over: 'job', from: '08:00', to: '12:00' });
    // 08:00 … 11:00: the window's end hour is not shown.
    expect(w.hours.map((h) => h.time)).toEqual(['08', '09', '10', '11'].map((h) => `${DAY}T${h}:00:00-05:00`));
  });

  it('when that job is called off for weather before it starts, then the hour kept is one of its own hours, not the windy afternoon', async () => {
    // 12:30 UTC is 07:30 at the farm: all of the job's hours are still ahead.
    const res = await s.operator.post(`/api/assignments/${s.spray}/events`, {
      type: 'call-off',
      reason: 'weather',
      at: '2026-05-14T12:30:00Z',
    });
    expect(res.status).toBe(201);
    const entry = res.body.events.find((e: { type: string }) => e.type === 'call-off');
    expect(['08', '09', '10', '11'].map((h) => `${DAY}T${h}:00:00-05:00`)).toContain(entry.weather.hour);
  });
});

describe('run sheet weather without a forecast', () => {
  let s: Setup;
  beforeAll(async () => {
    s = await setUp('Sheet no forecast');
  });

  it('when no forecast is stored, then the run sheet answers 200 and the job says there is no forecast yet', async () => {
    const w = (await sheetOf(s.operator)).assignments.find((a) => a.id === s.spray)!.weather!;
    expect(w).toMatchObject({ issuedAt: null, stale: true, hours: [], verdict: null });
    expect(w.staleReason).toMatch(/^No forecast yet/);
  });

  it('when the job is called off for weather without a forecast, then the call-off is logged without a forecast note', async () => {
    const res = await s.owner.post(`/api/assignments/${s.spray}/events`, {
      type: 'call-off',
      reason: 'weather',
      at: '2026-05-14T15:05:00Z',
    });
    expect(res.status).toBe(201);
    expect(res.body.state).toBe('called-off');
    const entry = res.body.events.find((e: { type: string }) => e.type === 'call-off');
    expect(entry).toMatchObject({ reason: 'weather', weather: null });
    const row = await t.db('assignment_events').where({ id: entry.id }).first();
    expect([row.weather_issued_at, row.weather_hour, row.weather_reason]).toEqual([null, null, null]);
  });
});
