// The local fake forecast server's seasons, read as the app reads them: its FlatBuffers answer
// decoded by the real `openmeteo` client (fetchForecasts), on loopback.
import { FakeForecastServer, seasonAt, type Scenario } from './fake-forecast';
import { fetchForecasts, type PointForecast } from './forecast.client';

let fake: FakeForecastServer;
beforeAll(async () => {
  fake = new FakeForecastServer();
  await fake.start(0);
});
afterAll(() => fake.stop());

/** A point at 49° N on the plains (the sun 6.77 h behind UTC). */
const PLAINS = { latitude: 49, longitude: -101.5 };

async function forecastOn(now: string, scenario: Scenario = 'calm', place = PLAINS): Promise<PointForecast> {
  fake.scenario = scenario;
  fake.now = new Date(now);
  const [f] = await fetchForecasts(fake.url, [place]);
  return f;
}

/** Each day's highest air temperature, °C. */
const dailyHighs = (f: PointForecast): number[] =>
  Array.from({ length: f.hours.length / 24 }, (_, d) => Math.max(...f.hours.slice(d * 24, d * 24 + 24).map((h) => h.temperature_c!)));
const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

// Recalled from memory, not a checked table: northern-plains climate normals near 49° N put December's mean
// daily high around −7 °C and July's around 26 °C. The checks are wide: the fake is shaped like them, no more.
describe('fake forecast: seasons for the date and latitude asked', () => {
  it('when December is asked at 49° N, then the daytime highs are below freezing and the soil is frozen', async () => {
    const f = await forecastOn('2026-12-15T15:00:00Z');
    expect(f.hours).toHaveLength(168);
    const highs = dailyHighs(f);
    expect(mean(highs)).toBeLessThan(0);
    expect(mean(highs)).toBeGreaterThan(-15);
    expect(Math.max(...f.hours.map((h) => h.soil_temperature_c!))).toBeLessThanOrEqual(0);
  });

  it('when July is asked at 49° N, then the days are warm and the soil warm enough to seed into', async () => {
    const f = await forecastOn('2026-07-15T15:00:00Z');
    const highs = dailyHighs(f);
    expect(mean(highs)).toBeGreaterThan(22);
    expect(mean(highs)).toBeLessThan(32);
    // Seeding minimums are about 3–5 °C soil (the farm limits' defaults, from memory): July is well above.
    expect(Math.min(...f.hours.map((h) => h.soil_temperature_c!))).toBeGreaterThan(10);
  });

  it('when the same day is asked further north, then it is colder there', async () => {
    const south = await forecastOn('2026-12-15T15:00:00Z', 'calm', { latitude: 48, longitude: -101.5 });
    const north = await forecastOn('2026-12-15T15:00:00Z', 'calm', { latitude: 51, longitude: -101.5 });
    expect(mean(dailyHighs(north))).toBeLessThan(mean(dailyHighs(south)));
  });

  it('when mid-May is asked, then the days run about 10–20 °C as the scenarios were written for', () => {
    const may = seasonAt(50, new Date('2026-05-14T00:00:00Z'));
    expect(may.airC - may.swingC).toBeGreaterThan(8);
    expect(may.airC + may.swingC).toBeGreaterThan(18);
    expect(may.airC + may.swingC).toBeLessThan(22);
  });

  it('when December is asked, then each scenario keeps its features: the windy afternoon, rain tomorrow, the clear calm evening, the cold morning', async () => {
    const day = '2026-12-15T15:00:00Z';
    // 21:00 UTC is 14:20 by the sun at −101.5°: afternoon; 03:00 UTC is 20:20 by the sun: evening.
    const windy = await forecastOn(day, 'windy-afternoon');
    // Asked in m/s, as the app asks: × 3.6 for km/h (SI definition of the km/h).
    expect(windy.hours[21].wind_speed_ms! * 3.6).toBeCloseTo(30, 1);
    const rain = await forecastOn(day, 'rain-tomorrow');
    // Tomorrow 15:00 UTC is 08:14 by the sun, inside the scenario's rain hours.
    expect(rain.hours[24 + 15].precipitation_mm).toBeGreaterThan(0);
    expect(rain.hours.slice(0, 24).every((h) => h.precipitation_mm === 0)).toBe(true);
    const evening = await forecastOn(day, 'calm-clear-evening');
    expect(evening.hours[3].wind_speed_ms! * 3.6).toBeCloseTo(3, 1);
    expect(evening.hours[3].cloud_cover_pct).toBe(5);
    const calm = await forecastOn(day, 'calm');
    const cold = await forecastOn(day, 'cold-morning');
    expect(Math.min(...cold.hours.map((h) => h.temperature_c!))).toBeLessThan(Math.min(...calm.hours.map((h) => h.temperature_c!)));
  });
});
