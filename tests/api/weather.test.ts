// Weather: the fake forecast server's scenarios through the real `openmeteo` client into the
// database and out through the API; the service failing in every way the wire allows; the limits.
import { mphToKmh } from '../../shared/units';
import { SPRAY_LABEL_CAUTION } from '../../shared/weather/limits';
import type { FieldForecast } from '../../shared/schemas/weather';
import { scenarioHours } from '../../server/weather/fake-forecast';
import { HOURLY } from '../../server/weather/forecast.client';
import { WeatherWorker } from '../../server/weather/weather-worker';
import { refreshFarmWeather } from '../../server/weather/weather.service';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { signedIn, startTestApp, type Client, type TestApp } from '../support/test-app';

let t: TestApp;

beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

/** A field of about 20 acres with its south-west corner at lon, lat. */
async function addField(farm: TestFarm, lon: number, lat: number, name = `F ${Math.random()}`): Promise<number> {
  const [row] = await t
    .db('fields')
    .insert({ farm_id: farm.id, name, boundary: JSON.stringify(rect(lon, lat, 0.004, 0.003)), area_m2: 80_000, acres: 19.77 })
    .returning('id');
  return row.id as number;
}

async function counts(farmId: number) {
  const [f] = await t.db('weather_forecasts').where({ farm_id: farmId }).count<{ count: string }[]>('* as count');
  const [h] = await t
    .db('weather_hours')
    .join('weather_forecasts', 'weather_forecasts.id', 'weather_hours.forecast_id')
    .where('weather_forecasts.farm_id', farmId)
    .count<{ count: string }[]>('* as count');
  return { forecasts: Number(f.count), hours: Number(h.count) };
}

/** Where the fake's hours start (its scenarios are set in May, UTC−5 at the farm). */
const NOW = new Date('2026-05-14T15:30:00Z');
/** When forecasts are fetched: the real clock, which the API's stale check reads. */
const FETCHED = new Date(Math.floor(Date.now() / 60_000) * 60_000);
const refresh = (farmId: number, now = FETCHED, timeoutMs?: number, url = t.weather.url) =>
  refreshFarmWeather(t.db, farmId, { url, now, timeoutMs });

describe('weather: decoding and storing', () => {
  let farm: TestFarm;
  let owner: Client;
  let fieldId: number;

  beforeAll(async () => {
    farm = await makeFarm(t.db, 'Weather');
    owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
    fieldId = await addField(farm, -101.512, 50.098);
    t.weather.mode = 'ok';
    t.weather.now = NOW;
  });

  it('when the fake answers a scenario, then the real client reads it and every stored value equals the one sent (value for value)', async () => {
    t.weather.scenario = 'windy-afternoon';
    const sent = t.weather.requests.length;
    expect(await refresh(farm.id)).toEqual({ points: 1, refreshed: 1, failed: 0 });
    expect(t.weather.requests.length).toBe(sent + 1);
    const point = await t.db('weather_points').where({ farm_id: farm.id }).first();
    // The field's centre (−101.510, 50.0995) rounds to the 0.05° cell centred at −101.5, 50.1.
    expect([point.latitude, point.longitude]).toEqual([50.1, -101.5]);
    const rows = await t
      .db('weather_hours')
      .join('weather_forecasts', 'weather_forecasts.id', 'weather_hours.forecast_id')
      .where('weather_forecasts.farm_id', farm.id)
      .orderBy('time')
      .select('weather_hours.*');
    const expected = scenarioHours('windy-afternoon', { latitude: 50.1, longitude: -101.5 }, NOW, 7, 'ms');
    expect(rows).toHaveLength(168);
    expect(rows[0].time.toISOString()).toBe('2026-05-14T00:00:00.000Z');
    const names = Object.fromEntries(HOURLY.map((h) => [h.column, h.name])) as Record<string, keyof (typeof expected.hours)[0]>;
    rows.forEach((row, i) => {
      expect(row.time.getTime()).toBe((expected.start + i * 3600) * 1000);
      for (const [column, name] of Object.entries(names)) expect(Math.fround(row[column])).toBe(expected.hours[i][name]);
    });
  });

  it('when a member reads the field, then hours come in the farm zone with SI-derived units, Delta T, and spraying no-go in the windy afternoon', async () => {
    const res = await owner.get(`/api/weather/fields/${fieldId}`);
    expect(res.status).toBe(200);
    const body = res.body as FieldForecast;
    expect(body.stale).toBe(false);
    expect(body.hours).toHaveLength(168);
    expect(body.issuedAt).toBe(new Date(Math.floor(FETCHED.getTime() / 3_600_000) * 3_600_000).toISOString());
    expect(body.fetchedAt).toBe(FETCHED.toISOString());
    // America/Chicago in May is UTC−5: 20:00 UTC is 15:00 at the farm, mid-afternoon by the sun at −101.5°.
    const h = body.hours.find((x) => x.time === '2026-05-14T15:00:00-05:00')!;
    expect(h.windSpeedKmh).toBe(30); // the scenario's 30 km/h, sent as m/s (8.333… as float32) and back
    expect(h.verdicts.spraying.verdict).toBe('no-go');
    expect(h.verdicts.spraying.reasons[0]).toBe('wind 18.6 mph at 15:00, above the spraying limit of 10.0 mph');
    expect(h.verdicts.spraying.reasons.at(-1)).toBe(SPRAY_LABEL_CAUTION);
    // Delta T from the stored temperature and humidity by Stull (2011), within its rounding.
    expect(h.deltaTC).not.toBeNull();
    const morning = body.hours.find((x) => x.time === '2026-05-14T09:00:00-05:00')!;
    expect(morning.windSpeedKmh).toBeLessThan(mphToKmh(10));
    expect(morning.verdicts.spraying.verdict).not.toBe('no-go');
  });

  it('when asked again within the hour, then the service is not asked; after an hour, then it is (hourly at most per point)', async () => {
    const sent = t.weather.requests.length;
    expect((await refresh(farm.id, new Date(FETCHED.getTime() + 59 * 60_000))).refreshed).toBe(0);
    expect(t.weather.requests.length).toBe(sent);
    expect((await refresh(farm.id, new Date(FETCHED.getTime() + 60 * 60_000))).refreshed).toBe(1);
    expect(t.weather.requests.length).toBe(sent + 1);
    expect((await counts(farm.id)).forecasts).toBe(2);
  });

  it('when two fields are within a cell and a third is far, then two points share one request', async () => {
    const other = await makeFarm(t.db, 'Weather points');
    await addField(other, -101.512, 50.098);
    await addField(other, -101.505, 50.102);
    await addField(other, -100.2, 49.7);
    t.weather.scenarioAt(49.7, -100.2, 'rain-tomorrow');
    const sent = t.weather.requests.length;
    expect(await refresh(other.id)).toEqual({ points: 2, refreshed: 2, failed: 0 });
    expect(t.weather.requests.length).toBe(sent + 1);
    const asked = t.weather.requests.at(-1)!;
    expect(asked.hostname).toBe('127.0.0.1');
    expect(asked.searchParams.get('latitude')!.split(',').sort()).toEqual(['49.7', '50.1']);
    // Each location got its own scenario: rain tomorrow only at the far one.
    const rain = await t
      .db('weather_hours')
      .join('weather_forecasts', 'weather_forecasts.id', 'weather_hours.forecast_id')
      .join('weather_points', 'weather_points.id', 'weather_forecasts.point_id')
      .where('weather_forecasts.farm_id', other.id)
      .where('precipitation_mm', '>', 0)
      .distinct('weather_points.latitude');
    expect(rain).toEqual([{ latitude: 49.7 }]);
    t.weather.scenarioAt(49.7, -100.2, null);
  });

  it('when the background worker runs, then it queues one job per farm and refreshes through pg-boss', async () => {
    const w = await makeFarm(t.db, 'Weather worker');
    await addField(w, -98.4, 51.2);
    const worker = new WeatherWorker(t.db, { url: t.weather.url, scheduleMs: 600_000 });
    expect(await worker.schedule()).toBeGreaterThanOrEqual(1);
    // A second round in the same slot queues nothing new for that farm.
    const before = await t.db.raw(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'weather' AND data->>'farm' = ?`, [String(w.id)]);
    await worker.schedule();
    const after = await t.db.raw(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'weather' AND data->>'farm' = ?`, [String(w.id)]);
    expect(after.rows[0].n).toBe(before.rows[0].n);
    await worker.drain();
    expect((await counts(w.id)).forecasts).toBe(1);
    await worker.stop();
  });

  it('when the app is set up for tests, then the forecast service is the loopback fake (no request leaves 127.0.0.1)', () => {
    expect(t.config.weatherUrl).toBe(t.weather.url);
    expect(new URL(t.config.weatherUrl!).hostname).toBe('127.0.0.1');
    expect(t.weather.requests.every((u) => u.pathname === '/v1/forecast')).toBe(true);
  });
});

describe('weather: the service failing', () => {
  let farm: TestFarm;
  let viewer: Client;
  let fieldId: number;
  let step = 0;
  /** Each case runs an hour after the last, so the point is due again. */
  const nextHour = () => new Date(FETCHED.getTime() + ++step * 3_600_000);

  beforeAll(async () => {
    farm = await makeFarm(t.db, 'Weather faults');
    viewer = await signedIn(t.app, farm.viewer.email, farm.viewer.password);
    fieldId = await addField(farm, -97.3, 49.9);
    t.weather.mode = 'ok';
    t.weather.scenario = 'calm';
    await refresh(farm.id, FETCHED);
  });
  afterEach(() => {
    t.weather.mode = 'ok';
  });

  const failing: [string, () => Promise<{ failed: number; error?: string }>, RegExp][] = [
    ['down (HTTP 500)', () => ((t.weather.mode = 'error500'), refresh(farm.id, nextHour())), /answered with an error/],
    ['dropping the connection', () => ((t.weather.mode = 'reset'), refresh(farm.id, nextHour())), /could not be reached/],
    [
      'slow (no answer within the time limit)',
      () => ((t.weather.mode = 'slow'), refresh(farm.id, nextHour(), 300)),
      /did not answer within/,
    ],
    [
      'answering garbage (an HTML page)',
      () => ((t.weather.mode = 'garbage'), refresh(farm.id, nextHour())),
      /not a forecast|without hourly/,
    ],
    ['answering an empty body', () => ((t.weather.mode = 'empty'), refresh(farm.id, nextHour())), /0 forecasts for 1 places/],
    [
      'answering FlatBuffers without hourly data',
      () => ((t.weather.mode = 'no-hourly'), refresh(farm.id, nextHour())),
      /without hourly data/,
    ],
  ];

  it.each(failing)(
    'when the service is %s, then the last forecast is kept, marked stale, nothing half-written, and the endpoint answers',
    async (_what, run, why) => {
      const before = await counts(farm.id);
      const outcome = await run();
      expect(outcome.failed).toBe(1);
      expect(outcome.error).toMatch(why);
      expect(await counts(farm.id)).toEqual(before);
      const res = await viewer.get(`/api/weather/fields/${fieldId}`);
      expect(res.status).toBe(200);
      expect(res.body.stale).toBe(true);
      expect(res.body.staleReason).toMatch(/the last refresh failed/);
      expect(res.body.hours).toHaveLength(168);
      expect(res.body.fetchedAt).toBe(FETCHED.toISOString());
    },
  );

  it('when the service cannot be reached at all (connection refused), then the same', async () => {
    const before = await counts(farm.id);
    const closed = new (t.weather.constructor as new () => typeof t.weather)();
    await closed.start(0);
    const url = closed.url;
    await closed.stop();
    const outcome = await refresh(farm.id, nextHour(), 2000, url);
    expect(outcome.failed).toBe(1);
    expect(outcome.error).toMatch(/could not be reached \(ECONNREFUSED/);
    expect(await counts(farm.id)).toEqual(before);
    expect((await viewer.get(`/api/weather/fields/${fieldId}`)).body.stale).toBe(true);
  });

  it('when the service answers again, then the forecast is fresh and no longer stale', async () => {
    expect((await refresh(farm.id, nextHour())).refreshed).toBe(1);
    // The API's clock is the real one: the stored forecast's age is whatever it is, but no failure follows it.
    const point = await t.db('weather_points').where({ farm_id: farm.id }).first();
    expect(point.last_failure_at).toBeNull();
  });

  it('when a field has no forecast yet, then the endpoint answers stale with no hours', async () => {
    const fresh = await addField(farm, -90.1, 45.3);
    const res = await viewer.get(`/api/weather/fields/${fresh}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ stale: true, hours: [], issuedAt: null, fetchedAt: null });
    expect(res.body.staleReason).toMatch(/No forecast yet/);
  });
});

describe('weather: limits', () => {
  let farm: TestFarm;
  let owner: Client;
  let operator: Client;

  beforeAll(async () => {
    farm = await makeFarm(t.db, 'Weather limits');
    owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
    operator = await signedIn(t.app, farm.operator.email, farm.operator.password);
  });

  it('when a member reads the limits, then the defaults come with their sources', async () => {
    const res = await operator.get('/api/weather/limits');
    expect(res.status).toBe(200);
    expect(res.body.limits.spraying.windMaxKmh).toBeCloseTo(mphToKmh(10), 9);
    expect(res.body.sources.spraying.windMaxKmh.note).toMatch(/National Pesticide Stewardship Alliance/);
    expect(res.body.sources.spraying.deltaTGoodMaxC.kind).toBe('from memory');
    expect(res.body.sources.harrowing.coldBelowC.kind).toBe('common practice, no published source');
    expect(res.body.sources.seeding.soilMinC.canola.kind).toBe('from memory');
  });

  it('when the owner raises the wind limit, then it is kept and the verdicts follow it', async () => {
    const limits = (await owner.get('/api/weather/limits')).body.limits;
    limits.spraying.windMaxKmh = 35;
    const res = await owner.put('/api/weather/limits', limits);
    expect(res.status).toBe(200);
    expect(res.body.limits.spraying.windMaxKmh).toBe(35);
    const fieldId = await addField(farm, -101.512, 50.098);
    t.weather.scenario = 'windy-afternoon';
    await refresh(farm.id);
    const h = (await owner.get(`/api/weather/fields/${fieldId}`)).body.hours.find(
      (x: { time: string }) => x.time === '2026-05-14T15:00:00-05:00',
    );
    // 30 km/h is inside 35 km/h now; its 45 km/h gusts are not: caution, not no-go.
    expect(h.windSpeedKmh).toBe(30);
    expect(h.verdicts.spraying.verdict).toBe('caution');
    expect(h.verdicts.spraying.reasons[0]).toBe('gusts 28.0 mph at 15:00, above the spraying limit of 21.7 mph');
  });

  it('when the limits make no sense, then 400 with the reason and nothing changes', async () => {
    const limits = (await owner.get('/api/weather/limits')).body.limits;
    const bad = { ...limits, spraying: { ...limits.spraying, windMinKmh: 20, windMaxKmh: 10 } };
    const res = await owner.put('/api/weather/limits', bad);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/lowest wind must be below the highest/);
    expect((await owner.get('/api/weather/limits')).body.limits.spraying.windMaxKmh).toBe(35);
  });

  it('when limits were stored with the old clock-hour inversion window, then it is dropped and the hours around sunset and sunrise come in', async () => {
    const other = await makeFarm(t.db, 'Weather old limits');
    const reader = await signedIn(t.app, other.owner.email, other.owner.password);
    const old = { ...(await reader.get('/api/weather/limits')).body.limits };
    const { inversionBeforeSunsetHours: _b, inversionAfterSunriseHours: _a, ...rest } = old.spraying;
    old.spraying = { ...rest, inversionFromHour: 16, inversionUntilHour: 10, windMaxKmh: 12 };
    await t.db('weather_limits').insert({ farm_id: other.id, limits: JSON.stringify(old) });
    const spraying = (await reader.get('/api/weather/limits')).body.limits.spraying;
    expect(spraying.windMaxKmh).toBe(12);
    expect(spraying).not.toHaveProperty('inversionFromHour');
    expect(spraying).not.toHaveProperty('inversionUntilHour');
    // The defaults: 2 h before sunset to 2 h after sunrise (common practice, no published source).
    expect([spraying.inversionBeforeSunsetHours, spraying.inversionAfterSunriseHours]).toEqual([2, 2]);
  });

  it('when the owner sets more than 6 inversion hours after sunrise, then 400 naming the limit', async () => {
    const limits = (await owner.get('/api/weather/limits')).body.limits;
    const res = await owner.put('/api/weather/limits', { ...limits, spraying: { ...limits.spraying, inversionAfterSunriseHours: 7 } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['spraying.inversionAfterSunriseHours']).toBe('The inversion hours after sunrise must be at most 6 hours');
  });

  it('when an operator tries to change them, then 403', async () => {
    const limits = (await owner.get('/api/weather/limits')).body.limits;
    expect((await operator.put('/api/weather/limits', limits)).status).toBe(403);
  });
});
