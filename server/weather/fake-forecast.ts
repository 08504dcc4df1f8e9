// A local forecast server for development and tests: answers the forecast service's
// `GET /v1/forecast?…&format=flatbuffers` in its wire format, so the real `openmeteo` client reads
// it. Answers are built with the FlatBuffers builders generated from the service's published
// schema (./generated), one size-prefixed WeatherApiResponse per location, back to back.
//
// What it answers is chosen on the object, not by the request (the real client sends nothing
// extra): `scenario` for every location, `scenarioAt(lat, lon, s)` for one location, `now` for
// where the hours start, and `mode` for a service that is down, slow or answers garbage.
// `npm start` starts one on loopback (FAKE_WEATHER_SCENARIO picks its scenario); tests start their own.
import http from 'node:http';
import { closeNow, listenOnLoopback } from '../http/loopback';
import { Builder } from 'flatbuffers';
import { Model } from './generated/model';
import { Unit } from './generated/unit';
import { Variable } from './generated/variable';
import { VariableWithValues } from './generated/variable-with-values';
import { VariablesWithTime } from './generated/variables-with-time';
import { WeatherApiResponse } from './generated/weather-api-response';

export const SCENARIOS = ['calm', 'windy-afternoon', 'rain-tomorrow', 'cold-morning', 'calm-clear-evening'] as const;
export type Scenario = (typeof SCENARIOS)[number];
export const isScenario = (s: string): s is Scenario => (SCENARIOS as readonly string[]).includes(s);

/**
 * ok: forecasts. error500: HTTP 500 with an error text. reset: the connection is dropped without
 * an answer. slow: never answers. garbage: 200 with an HTML page. empty: 200 with no body.
 * no-hourly: well-formed FlatBuffers without the hourly block.
 */
export type FakeMode = 'ok' | 'error500' | 'reset' | 'slow' | 'garbage' | 'empty' | 'no-hourly';

/** The hourly variables the fake knows, as the service names them, with what it declares for each. */
const KNOWN: Record<string, { variable: Variable; unit: Unit; altitude?: number; depth?: number }> = {
  temperature_2m: { variable: Variable.temperature, unit: Unit.celsius, altitude: 2 },
  relative_humidity_2m: { variable: Variable.relative_humidity, unit: Unit.percentage, altitude: 2 },
  dew_point_2m: { variable: Variable.dew_point, unit: Unit.celsius, altitude: 2 },
  precipitation: { variable: Variable.precipitation, unit: Unit.millimetre },
  precipitation_probability: { variable: Variable.precipitation_probability, unit: Unit.percentage },
  wind_speed_10m: { variable: Variable.wind_speed, unit: Unit.kilometres_per_hour, altitude: 10 },
  wind_gusts_10m: { variable: Variable.wind_gusts, unit: Unit.kilometres_per_hour, altitude: 10 },
  wind_direction_10m: { variable: Variable.wind_direction, unit: Unit.degree_direction, altitude: 10 },
  cloud_cover: { variable: Variable.cloud_cover, unit: Unit.percentage },
  soil_temperature_6cm: { variable: Variable.soil_temperature, unit: Unit.celsius, depth: 6 },
};

/** One scenario hour, in the service's default units (°C, %, mm, km/h, °). */
export interface ScenarioHour {
  temperature_2m: number;
  relative_humidity_2m: number;
  dew_point_2m: number;
  precipitation: number;
  precipitation_probability: number;
  wind_speed_10m: number;
  wind_gusts_10m: number;
  wind_direction_10m: number;
  cloud_cover: number;
  soil_temperature_6cm: number;
}

/** Dew point, °C, by the Magnus formula (Alduchov and Eskridge 1996 constants), for consistent scenario values. */
function dewPoint(t: number, rh: number): number {
  const g = Math.log(rh / 100) + (17.625 * t) / (243.04 + t);
  return (243.04 * g) / (17.625 - g);
}

/**
 * Monthly mean air temperature, °C, at 50° N, January … December, and the half-range of a day's
 * swing around it: invented for the local fake, shaped like northern-plains climate normals; not a
 * published table. May stays near what the scenarios always had (about 10–20 °C), so a test set in
 * May reads the values it was written for.
 */
const MONTHLY_MEAN_C = [-16, -13, -6, 5, 15.5, 19, 21, 20, 14, 6, -4, -13];
const MONTHLY_SWING_C = [4, 4, 4.5, 5, 5, 5.5, 6, 6, 5.5, 5, 4, 4];
/** Colder by this much per degree of latitude poleward of 50° (invented, the plains' rough north–south gradient). */
const PER_DEGREE_C = 0.8;

/** The season at a place on a day: the day's mean air temperature, its half-range, and the soil's mean near seeding depth. */
export interface Season {
  airC: number;
  swingC: number;
  soilC: number;
}

/**
 * The season on `day` (UTC) at `latitude`: the monthly table read at mid-months and interpolated
 * between them by day, colder poleward (the table's latitude effect is held to 35–65°), the seasons
 * turned half a year round south of the equator. The soil near seeding depth follows the air 4 °C
 * cooler while the air is above freezing; under frost (snow cover) it stays near 0 °C (invented,
 * shaped like what soil does; not a published model).
 */
export function seasonAt(latitude: number, day: Date): Season {
  const year = day.getUTCFullYear();
  const month = day.getUTCMonth() + (latitude < 0 ? 6 : 0);
  const daysIn = (m: number) => new Date(Date.UTC(year, m + 1, 0)).getUTCDate();
  // Position in months from mid-January: mid-month (day 15.5 of 31) is a whole number.
  const t = month + (day.getUTCDate() - 0.5 - daysIn(day.getUTCMonth()) / 2) / daysIn(day.getUTCMonth());
  const at = (table: readonly number[]) => {
    const i = Math.floor(t);
    const f = t - i;
    const a = table[((i % 12) + 12) % 12];
    const b = table[(((i + 1) % 12) + 12) % 12];
    return a + (b - a) * f;
  };
  const poleward = Math.min(65, Math.max(35, Math.abs(latitude))) - 50;
  const airC = at(MONTHLY_MEAN_C) - PER_DEGREE_C * poleward;
  return { airC, swingC: at(MONTHLY_SWING_C), soilC: Math.max(airC - 4, airC / 4 - 1) };
}

/**
 * The scenario's hour: `day` counts from the first day of the forecast (0 = today), `solarHour`
 * is the hour by the sun at the location (UTC + longitude / 15), which drives the day's cycle;
 * `season` sets the temperatures of the date and latitude asked. Each scenario keeps its own
 * features in every season: wind in the afternoon, rain tomorrow morning, a morning colder than the
 * season's and damp, light wind under a clear evening sky.
 */
export function scenarioHour(scenario: Scenario, day: number, solarHour: number, season: Season): ScenarioHour {
  // A day's swing: 1 at 15:00 by the sun, −1 at 03:00.
  const swing = Math.sin(((solarHour - 9) / 24) * 2 * Math.PI);
  let t = season.airC + season.swingC * swing;
  let rh = 62 - 10 * swing;
  let rain = 0;
  let chance = 5;
  let wind = 10 + 2 * swing;
  let cloud = 40;
  // Frozen ground barely follows the day.
  let soil = season.soilC + (season.soilC > 0 ? 1.5 : 0.5) * swing;
  const afternoon = solarHour >= 12 && solarHour < 18;
  const evening = solarHour >= 17 || solarHour < 9;
  switch (scenario) {
    case 'calm':
      break;
    case 'windy-afternoon':
      if (afternoon) wind = 30;
      break;
    case 'rain-tomorrow':
      if (day === 1 && solarHour >= 6 && solarHour < 14) {
        rain = 2.5;
        chance = 90;
        rh = 96;
        cloud = 100;
      } else if (day === 1) {
        chance = 40;
        cloud = 80;
      }
      break;
    case 'cold-morning':
      // 8 °C under the season's mean, with a wider swing: in mid-May about 1–13 °C, soil about 2–6 °C.
      t = season.airC - 8 + 6 * swing;
      rh = 80 - 15 * swing;
      soil = season.soilC - 6.5 + 2 * swing;
      if (solarHour >= 4 && solarHour < 9) rh = 97;
      break;
    case 'calm-clear-evening':
      cloud = 5;
      if (evening) wind = 3;
      break;
  }
  return {
    temperature_2m: t,
    relative_humidity_2m: rh,
    dew_point_2m: dewPoint(t, rh),
    precipitation: rain,
    precipitation_probability: chance,
    wind_speed_10m: wind,
    wind_gusts_10m: wind * 1.5,
    wind_direction_10m: (200 + day * 20) % 360,
    cloud_cover: cloud,
    soil_temperature_6cm: soil,
  };
}

/** The first hour the service answers: midnight UTC of `now`'s day (it answers whole days, timezone GMT). */
export const forecastStart = (now: Date): number => Math.floor(now.getTime() / 86_400_000) * 86_400;

/** A scenario's hours at a location, as the fake sends them (float32, wind in `windUnit`), in the season of each day there. */
export function scenarioHours(
  scenario: Scenario,
  place: { latitude: number; longitude: number },
  now: Date,
  days = 7,
  windUnit: 'kmh' | 'ms' = 'kmh',
): { start: number; hours: ScenarioHour[] } {
  const start = forecastStart(now);
  const hours: ScenarioHour[] = [];
  const seasons = Array.from({ length: days }, (_, d) => seasonAt(place.latitude, new Date((start + d * 86_400) * 1000)));
  for (let k = 0; k < days * 24; k++) {
    const solar = ((((k % 24) + place.longitude / 15) % 24) + 24) % 24;
    const h = scenarioHour(scenario, Math.floor(k / 24), solar, seasons[Math.floor(k / 24)]);
    if (windUnit === 'ms') {
      h.wind_speed_10m /= 3.6;
      h.wind_gusts_10m /= 3.6;
    }
    for (const key of Object.keys(h) as (keyof ScenarioHour)[]) h[key] = Math.fround(h[key]);
    hours.push(h);
  }
  return { start, hours };
}

const round2 = (n: number) => Math.round(n * 100) / 100;

export class FakeForecastServer {
  /** What every location gets unless `scenarioAt` says otherwise. */
  scenario: Scenario = 'calm';
  mode: FakeMode = 'ok';
  /** Where the hours start (midnight UTC of its day); the test may set it. */
  now: Date = new Date();
  /** Every request's URL, oldest first. */
  readonly requests: URL[] = [];
  private readonly perLocation = new Map<string, Scenario>();
  private server: http.Server | null = null;
  private readonly hanging = new Set<http.ServerResponse>();
  port = 0;

  /** Sets the scenario of one location (its latitude and longitude as asked, to 2 decimals). */
  scenarioAt(latitude: number, longitude: number, scenario: Scenario | null): void {
    const key = `${round2(latitude)},${round2(longitude)}`;
    if (scenario) this.perLocation.set(key, scenario);
    else this.perLocation.delete(key);
  }

  scenarioOf(latitude: number, longitude: number): Scenario {
    return this.perLocation.get(`${round2(latitude)},${round2(longitude)}`) ?? this.scenario;
  }

  /** The forecast endpoint, as WEATHER_URL would name it. */
  get url(): string {
    return `http://127.0.0.1:${this.port}/v1/forecast`;
  }

  async start(port = 0): Promise<number> {
    const server = http.createServer((req, res) => this.answer(req, res));
    this.port = await listenOnLoopback(server, port);
    this.server = server;
    return this.port;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    for (const res of this.hanging) res.destroy();
    this.hanging.clear();
    if (!server) return;
    await closeNow(server);
  }

  private answer(req: http.IncomingMessage, res: http.ServerResponse): void {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1');
    this.requests.push(url);
    if (req.method !== 'GET' || url.pathname !== '/v1/forecast') return void res.writeHead(404).end('not found');
    switch (this.mode) {
      case 'error500':
        return void res.writeHead(500, { 'Content-Type': 'text/plain' }).end('internal error');
      case 'reset':
        return void req.socket.destroy();
      case 'slow':
        this.hanging.add(res);
        res.once('close', () => this.hanging.delete(res));
        return;
      case 'garbage':
        return void res.writeHead(200, { 'Content-Type': 'text/html' }).end('<html><body>Service temporarily unavailable</body></html>');
      case 'empty':
        return void res.writeHead(200, { 'Content-Type': 'application/octet-stream' }).end();
      default:
        break;
    }
    const error = (reason: string) =>
      void res.writeHead(400, { 'Content-Type': 'application/json' }).end(JSON.stringify({ error: true, reason }));
    if (url.searchParams.get('format') !== 'flatbuffers') return error('This fake answers format=flatbuffers only');
    const lats = (url.searchParams.get('latitude') ?? '').split(',').map(Number);
    const lons = (url.searchParams.get('longitude') ?? '').split(',').map(Number);
    if (!lats.length || lats.length !== lons.length || [...lats, ...lons].some((n) => !Number.isFinite(n)))
      return error('Parameter count of latitude and longitude must be the same');
    if (lats.some((l) => l < -90 || l > 90) || lons.some((l) => l < -180 || l > 180)) return error('Latitude or longitude out of range');
    const names = (url.searchParams.get('hourly') ?? '').split(',').filter(Boolean);
    const unknown = names.find((n) => !KNOWN[n]);
    if (unknown) return error(`Cannot initialize WeatherVariable from invalid String value ${unknown} for key hourly`);
    const days = Number(url.searchParams.get('forecast_days') ?? 7);
    if (!Number.isInteger(days) || days < 1 || days > 16) return error('Forecast days is invalid. Allowed range 1 to 16.');
    const windUnit = url.searchParams.get('wind_speed_unit') === 'ms' ? 'ms' : 'kmh';
    const parts = lats.map((lat, i) => this.message(lat, lons[i], i, names, days, windUnit));
    res.writeHead(200, { 'Content-Type': 'application/octet-stream' }).end(Buffer.concat(parts));
  }

  /** One location's size-prefixed WeatherApiResponse. */
  private message(latitude: number, longitude: number, locationId: number, names: string[], days: number, windUnit: 'kmh' | 'ms'): Buffer {
    const { start, hours } = scenarioHours(this.scenarioOf(latitude, longitude), { latitude, longitude }, this.now, days, windUnit);
    const b = new Builder(4096);
    const variables = names.map((name) => {
      const known = KNOWN[name];
      const values = VariableWithValues.createValuesVector(
        b,
        Float32Array.from(hours, (h) => h[name as keyof ScenarioHour]),
      );
      VariableWithValues.startVariableWithValues(b);
      VariableWithValues.addVariable(b, known.variable);
      const unit = windUnit === 'ms' && known.unit === Unit.kilometres_per_hour ? Unit.metre_per_second : known.unit;
      VariableWithValues.addUnit(b, unit);
      VariableWithValues.addValues(b, values);
      if (known.altitude) VariableWithValues.addAltitude(b, known.altitude);
      if (known.depth) VariableWithValues.addDepth(b, known.depth);
      return VariableWithValues.endVariableWithValues(b);
    });
    let hourly = 0;
    if (this.mode !== 'no-hourly') {
      const vector = VariablesWithTime.createVariablesVector(b, variables);
      VariablesWithTime.startVariablesWithTime(b);
      VariablesWithTime.addTime(b, BigInt(start));
      VariablesWithTime.addTimeEnd(b, BigInt(start + hours.length * 3600));
      VariablesWithTime.addInterval(b, 3600);
      VariablesWithTime.addVariables(b, vector);
      hourly = VariablesWithTime.endVariablesWithTime(b);
    }
    const timezone = b.createString('GMT');
    const abbreviation = b.createString('GMT');
    WeatherApiResponse.startWeatherApiResponse(b);
    // The service answers the nearest point of its model grid; the fake answers the point asked.
    WeatherApiResponse.addLatitude(b, latitude);
    WeatherApiResponse.addLongitude(b, longitude);
    WeatherApiResponse.addElevation(b, 600);
    WeatherApiResponse.addGenerationTimeMilliseconds(b, 0.5);
    WeatherApiResponse.addLocationId(b, BigInt(locationId));
    WeatherApiResponse.addModel(b, Model.best_match);
    WeatherApiResponse.addUtcOffsetSeconds(b, 0);
    WeatherApiResponse.addTimezone(b, timezone);
    WeatherApiResponse.addTimezoneAbbreviation(b, abbreviation);
    if (hourly) WeatherApiResponse.addHourly(b, hourly);
    WeatherApiResponse.finishSizePrefixedWeatherApiResponseBuffer(b, WeatherApiResponse.endWeatherApiResponse(b));
    return Buffer.from(b.asUint8Array());
  }
}
