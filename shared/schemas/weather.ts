// Weather: the address parameters, the owner's limits and the shape of what the API answers.
// Forecast hours are in °C, %, mm, km/h and degrees; the screens convert to the farm's units.
import * as z from 'zod';
import { SEED_CROPS, WEATHER_OPERATIONS, type LimitSource, type WeatherLimits } from '../weather/limits';
import { dbId } from './common';

export const weatherFieldParams = z.object({ fieldId: dbId });

const between = (what: string, min: number, max: number, unit: string) =>
  z
    .number({ message: `${what} must be a number` })
    .min(min, `${what} must be at least ${min}${unit}`)
    .max(max, `${what} must be at most ${max}${unit}`);
const hours = (what: string) => between(what, 0, 48, ' hours').int(`${what} must be whole hours`);
/** Hours before sunset or after sunrise: up to 6, past which the two would meet on a short winter day. */
const aroundSun = (what: string) => between(what, 0, 6, ' hours').int(`${what} must be whole hours`);
const blocking = z.boolean({ message: 'Say whether a no-go forecast blocks the board (true or false)' });

const sprayingLimits = z
  .object({
    blocking,
    windMinKmh: between('The lowest wind for spraying', 0, 50, ' km/h'),
    windMaxKmh: between('The highest wind for spraying', 1, 60, ' km/h'),
    rainFreeHours: hours('The rain-free hours after spraying'),
    rainMm: between('The rain that counts', 0.1, 50, ' mm'),
    rainChanceCautionPct: between('The chance of rain for a caution', 1, 100, ' %'),
    deltaTMinC: between('The lowest Delta T', 0, 10, ' °C'),
    deltaTGoodMaxC: between('The highest good Delta T', 1, 20, ' °C'),
    deltaTCautionMaxC: between('The highest Delta T with caution', 1, 25, ' °C'),
    inversionWindKmh: between('The inversion wind', 0, 30, ' km/h'),
    inversionCloudMaxPct: between('The clear-sky cloud cover', 0, 100, ' %'),
    inversionBeforeSunsetHours: aroundSun('The inversion hours before sunset'),
    inversionAfterSunriseHours: aroundSun('The inversion hours after sunrise'),
  })
  .refine((l) => l.windMinKmh < l.windMaxKmh, { message: 'The lowest wind must be below the highest', path: ['windMaxKmh'] })
  .refine((l) => l.deltaTMinC < l.deltaTGoodMaxC && l.deltaTGoodMaxC <= l.deltaTCautionMaxC, {
    message: 'Delta T limits go up: lowest, then highest good, then highest with caution',
    path: ['deltaTGoodMaxC'],
  });

const harrowingLimits = z.object({
  blocking,
  rainMm: between('The rain that counts', 0.1, 50, ' mm'),
  wetAfterRainHours: hours('The hours straw stays wet'),
  dewSpreadC: between('The dew spread', 0, 10, ' °C'),
  coldBelowC: between('The cold limit', -30, 30, ' °C'),
});

const soilMin = between('A soil temperature minimum', -5, 30, ' °C');
const seedingLimits = z.object({
  blocking,
  soilMinC: z.object(Object.fromEntries(SEED_CROPS.map((c) => [c, soilMin])) as Record<(typeof SEED_CROPS)[number], typeof soilMin>),
  heavyRainMm: between('Heavy rain', 0.5, 100, ' mm'),
});

const harvestLimits = z.object({
  blocking,
  rainMm: between('The rain that counts', 0.1, 50, ' mm'),
  afterRainHours: hours('The hours the crop stays wet'),
  humidityCautionPct: between('The humidity for a caution', 1, 100, ' %'),
  dewSpreadC: between('The dew spread', 0, 10, ' °C'),
});

/** `PUT /api/weather/limits`: every operation's limits, whole (the screen sends the table back). */
export const weatherLimitsBody = z.object({
  harrowing: harrowingLimits,
  seeding: seedingLimits,
  spraying: sprayingLimits,
  swathing: harvestLimits,
  combining: harvestLimits,
}) satisfies z.ZodType<WeatherLimits>;

const sourceSchema = z.object({
  kind: z.enum(['published', 'from memory', 'common practice, no published source']),
  note: z.string(),
}) satisfies z.ZodType<LimitSource>;

/** What `GET` and `PUT /api/weather/limits` answer: the farm's limits, the defaults and each default's source. */
export const weatherLimitsAnswer = z.object({
  limits: weatherLimitsBody,
  defaults: weatherLimitsBody,
  /** Key for key as in `defaults`: `sources.seeding.soilMinC.canola`. */
  sources: z.record(z.string(), z.record(z.string(), z.union([sourceSchema, z.record(z.string(), sourceSchema)]))),
});
export type WeatherLimitsAnswer = z.infer<typeof weatherLimitsAnswer>;

const verdict = z.object({ verdict: z.enum(['go', 'caution', 'no-go']), reasons: z.array(z.string()) });
const maybe = z.number().nullable();

export const forecastHour = z.object({
  /** ISO 8601 with the farm's offset. */
  time: z.string(),
  temperatureC: maybe,
  relativeHumidityPct: maybe,
  dewPointC: maybe,
  precipitationMm: maybe,
  precipitationProbabilityPct: maybe,
  windSpeedKmh: maybe,
  windGustKmh: maybe,
  windDirectionDeg: maybe,
  cloudCoverPct: maybe,
  soilTemperatureC: maybe,
  /** Air minus wet-bulb temperature (Stull 2011), °C. */
  deltaTC: maybe,
  verdicts: z.object(
    Object.fromEntries(WEATHER_OPERATIONS.map((o) => [o, verdict])) as Record<(typeof WEATHER_OPERATIONS)[number], typeof verdict>,
  ),
});
export type ForecastHour = z.infer<typeof forecastHour>;

/** What `GET /api/weather/fields/:fieldId` answers. */
export const fieldForecast = z.object({
  fieldId: z.number().int(),
  /** The forecast point the field shares with its neighbours (a 0.05° grid cell's centre). */
  point: z.object({ latitude: z.number(), longitude: z.number() }),
  /** When the shown forecast was issued and fetched; null before the first one arrived. */
  issuedAt: z.string().nullable(),
  fetchedAt: z.string().nullable(),
  /** Minutes since `fetchedAt`. */
  ageMinutes: z.number().int().nullable(),
  /** True when the last refresh failed, the forecast is older than two hours, or there is none yet. */
  stale: z.boolean(),
  /** Why it is stale, in plain words; null when it is not. */
  staleReason: z.string().nullable(),
  /** The crop of the field this season that seeding was judged for, if the limits table has it. */
  seedingCrop: z.enum(SEED_CROPS).nullable(),
  hours: z.array(forecastHour),
});
export type FieldForecast = z.infer<typeof fieldForecast>;
