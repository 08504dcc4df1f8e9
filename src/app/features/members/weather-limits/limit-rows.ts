import type { UnitSystem } from '@shared/schemas/auth';
import { weatherLimitsBody } from '@shared/schemas/weather';
import { roundTo } from '@shared/round';
import {
  formatHours,
  formatPercent,
  formatRain,
  formatTemperature,
  formatTemperatureDifference,
  formatWind,
  weatherUnit,
  type WeatherFigure,
} from '@shared/figures';
import { fDiffToC, fToC, inToMm, mphToKmh } from '@shared/units';
import { SEED_CROPS, type WeatherLimits, type WeatherOperation } from '@shared/weather/limits';
import type { ZodNumber } from 'zod';
import type { FormFields } from '../../../shared/forms/field-labels';

/** What a limit measures, which decides its unit on the screen. */
export type Quantity = 'speed' | 'temperature' | 'difference' | 'rain' | 'hours' | 'percent';

/** One number of the limits table: its place in the API body and how the owner reads it. */
export interface LimitRow {
  /** The path in the body and in an error's `fields` (`spraying.windMaxKmh`, `seeding.soilMinC.canola`). */
  key: string;
  /** The row's control in the form: the key with `/` for `.` (form control names take no dots). */
  control: string;
  operation: WeatherOperation;
  /** The row's words in its operation's table ("Highest wind"). */
  label: string;
  /** The row named on its own, for a refusal and for screen readers ("Highest wind (spraying)"). */
  fullLabel: string;
  quantity: Quantity;
}

export interface OperationTable {
  operation: WeatherOperation;
  label: string;
  rows: LimitRow[];
}

type RowSpec = [key: string, label: string, quantity: Quantity];

const harvestRows: RowSpec[] = [
  ['rainMm', 'Rain that counts, per hour', 'rain'],
  ['afterRainHours', 'No-go after rain for', 'hours'],
  ['humidityCautionPct', 'Caution at humidity from', 'percent'],
  ['dewSpreadC', 'Dew: air within this of the dew point', 'difference'],
];

// Every number of WeatherLimits has a row (the spec checks it against the defaults): a PUT sends
// the whole object, and a number the owner cannot see would be one they cannot put right.
const TABLES: Array<[WeatherOperation, string, RowSpec[]]> = [
  [
    'harrowing',
    'Harrowing straw',
    [
      ['rainMm', 'Rain that counts, per hour', 'rain'],
      ['wetAfterRainHours', 'Straw stays wet after rain for', 'hours'],
      ['dewSpreadC', 'Dew: air within this of the dew point', 'difference'],
      ['coldBelowC', 'Caution when colder than', 'temperature'],
    ],
  ],
  [
    'seeding',
    'Seeding',
    [
      ...SEED_CROPS.map((crop): RowSpec => [`soilMinC.${crop}`, `Soil temperature minimum, ${crop}`, 'temperature']),
      ['heavyRainMm', 'Heavy rain, per hour', 'rain'],
    ],
  ],
  [
    'spraying',
    'Spraying',
    [
      ['windMinKmh', 'Lowest wind', 'speed'],
      ['windMaxKmh', 'Highest wind', 'speed'],
      ['rainFreeHours', 'Rain-free hours after spraying', 'hours'],
      ['rainMm', 'Rain that counts, per hour', 'rain'],
      ['rainChanceCautionPct', 'Chance of rain for a caution', 'percent'],
      ['deltaTMinC', 'Delta T: no-go under', 'difference'],
      ['deltaTGoodMaxC', 'Delta T: good up to', 'difference'],
      ['deltaTCautionMaxC', 'Delta T: caution up to, no-go over', 'difference'],
      ['inversionWindKmh', 'Inversion risk: wind under', 'speed'],
      ['inversionCloudMaxPct', 'Inversion risk: cloud cover at most', 'percent'],
      ['inversionBeforeSunsetHours', 'Inversion risk: from this long before sunset', 'hours'],
      ['inversionAfterSunriseHours', 'Inversion risk: until this long after sunrise', 'hours'],
    ],
  ],
  ['swathing', 'Swathing', harvestRows],
  ['combining', 'Combining', harvestRows],
];

/** The limits table, one table per operation in the order of a season. */
export const LIMIT_TABLES: OperationTable[] = TABLES.map(([operation, label, specs]) => ({
  operation,
  label,
  rows: specs.map(([key, rowLabel, quantity]) => ({
    key: `${operation}.${key}`,
    control: `${operation}/${key}`.replaceAll('.', '/'),
    operation,
    label: rowLabel,
    fullLabel: `${rowLabel} (${label.toLowerCase()})`,
    quantity,
  })),
}));

export const LIMIT_ROWS: LimitRow[] = LIMIT_TABLES.flatMap((t) => t.rows);

/** The body key of an operation's "no-go blocks the board" box, and its control. */
export const blockingKey = (operation: WeatherOperation): string => `${operation}.blocking`;
export const blockingControl = (operation: WeatherOperation): string => `${operation}/blocking`;
export const blockingLabel = (t: OperationTable): string => `A no-go forecast blocks the board (${t.label.toLowerCase()})`;

/**
 * Each key of `PUT /api/weather/limits` and the box it is typed in, by its label: a refusal names
 * the box ("Check Highest wind (spraying): …"), never the key.
 */
export const WEATHER_LIMIT_FIELDS: FormFields = Object.fromEntries([
  ...LIMIT_ROWS.map((r) => [r.key, { control: r.control, label: r.fullLabel }]),
  ...LIMIT_TABLES.map((t) => [blockingKey(t.operation), { control: blockingControl(t.operation), label: blockingLabel(t) }]),
]);

/** A value at a path of a nested object (`seeding.soilMinC.canola`). */
export function valueAt(obj: unknown, key: string): unknown {
  let at: unknown = obj;
  for (const part of key.split('.')) at = at && typeof at === 'object' ? (at as Record<string, unknown>)[part] : undefined;
  return at;
}

function setAt(obj: Record<string, unknown>, key: string, value: unknown): void {
  const parts = key.split('.');
  let at = obj;
  for (const part of parts.slice(0, -1)) at = at[part] as Record<string, unknown>;
  at[parts.at(-1)!] = value;
}

/** How one quantity reads in the farm's units. */
export interface ShownUnit {
  /** Written after the number ("mph", "°F"). */
  unit: string;
  /** Decimals shown and typed. */
  digits: number;
  toShown: (si: number) => number;
  toSi: (shown: number) => number;
}

const same = (n: number): number => n;

const WEATHER_FIGURE: Partial<Record<Quantity, WeatherFigure>> = {
  speed: 'wind',
  temperature: 'temperature',
  difference: 'difference',
  rain: 'rain',
};
const TO_SI: Record<WeatherFigure, [us: (shown: number) => number, metric: (shown: number) => number]> = {
  wind: [mphToKmh, same],
  temperature: [fToC, same],
  difference: [fDiffToC, same],
  rain: [inToMm, same],
};

/**
 * The unit a quantity is shown in: the unit words and decimals of the same figure in a forecast
 * and a verdict's reasons (shared/figures.ts: mph / °F / inches for US farms, km/h / °C / mm for
 * metric); hours and percent stay as they are.
 */
export function shownUnit(quantity: Quantity, system: UnitSystem): ShownUnit {
  const kind = WEATHER_FIGURE[quantity];
  if (kind) {
    const w = weatherUnit(kind, system);
    return { unit: w.unit, digits: w.decimals, toShown: w.convert, toSi: TO_SI[kind][system === 'us' ? 0 : 1] };
  }
  // Whole hours are typed; they read with the one decimal of every hour figure.
  return quantity === 'hours' ? { unit: 'h', digits: 0, toShown: same, toSi: same } : { unit: '%', digits: 0, toShown: same, toSi: same };
}

/** A stored (SI) value as the box shows it, rounded to the unit's decimals. */
export function shownValue(si: number, quantity: Quantity, system: UnitSystem): number {
  const u = shownUnit(quantity, system);
  const n = roundTo(u.toShown(si), u.digits);
  // −0 (a reading just under zero, rounded) shows and compares as 0.
  return n === 0 ? 0 : n;
}

/**
 * The SI value to send for what the box holds. When the box still shows what `base` (the stored or
 * reset-to value) shows, `base` itself goes back: a limit typed in km/h and read in mph is sent as
 * it was, so saving unchanged numbers never moves them. A changed number is converted and kept to
 * 3 decimals, which reads back as the same shown number (an error under 0.001 SI units).
 */
export function siValue(shown: number, base: number, quantity: Quantity, system: UnitSystem): number {
  if (shown === shownValue(base, quantity, system)) return base;
  return roundTo(shownUnit(quantity, system).toSi(shown), 3);
}

/** A stored value in words, as the reasons write it (shared/figures.ts): "10.0 mph", "39.2 °F", "2.0 h". */
export function shownText(si: number, quantity: Quantity, system: UnitSystem): string {
  switch (quantity) {
    case 'speed':
      return formatWind(si, system);
    case 'temperature':
      return formatTemperature(si, system);
    case 'difference':
      return formatTemperatureDifference(si, system);
    case 'rain':
      return formatRain(si, system);
    case 'hours':
      return formatHours(si);
    case 'percent':
      return formatPercent(si);
  }
}

/** The shared schema's number for a row (the same bounds the server checks). */
function numberSchema(key: string): ZodNumber {
  let at: unknown = weatherLimitsBody;
  for (const part of key.split('.')) at = (at as { shape: Record<string, unknown> }).shape[part];
  return at as ZodNumber;
}

const EPS = 1e-9;
const ceilTo = (n: number, digits: number) => Math.ceil(n * 10 ** digits - EPS) / 10 ** digits;
const floorTo = (n: number, digits: number) => Math.floor(n * 10 ** digits + EPS) / 10 ** digits;

/** The range a row's box takes, in the farm's units, rounded inwards so both ends are accepted. */
export function shownRange(row: LimitRow, system: UnitSystem): { min: number; max: number } {
  const schema = numberSchema(row.key);
  const u = shownUnit(row.quantity, system);
  return { min: ceilTo(u.toShown(schema.minValue ?? 0), u.digits), max: floorTo(u.toShown(schema.maxValue ?? 0), u.digits) };
}

/**
 * The problem of one box as typed, in the farm's units (null when none): empty, outside the
 * shared schema's range, or not whole where whole hours are asked.
 */
export function rowProblem(row: LimitRow, shown: number | null, base: number, system: UnitSystem): string | null {
  if (shown === null || !Number.isFinite(shown)) return 'Enter a number';
  const schema = numberSchema(row.key);
  const si = siValue(shown, base, row.quantity, system);
  const { min, max } = shownRange(row, system);
  const u = shownUnit(row.quantity, system);
  const unit = u.unit === '%' ? ' %' : ` ${u.unit}`;
  if ((schema.minValue !== null && si < schema.minValue) || (schema.maxValue !== null && si > schema.maxValue)) {
    return `Use ${min} to ${max}${unit}`;
  }
  if (schema.isInt && !Number.isInteger(si)) return 'Use whole hours';
  return null;
}

/** The stored values of every row, by control (SI). */
export function rowValues(limits: WeatherLimits): Record<string, number> {
  return Object.fromEntries(LIMIT_ROWS.map((r) => [r.control, valueAt(limits, r.key) as number]));
}

/**
 * The body of `PUT /api/weather/limits`: the loaded limits (so keys this screen does not know go
 * back as they came), each row's SI value for what its box holds, and each blocking box (all by control).
 */
export function limitsBody(
  loaded: WeatherLimits,
  shown: Record<string, number | null>,
  base: Record<string, number>,
  blocking: Record<string, boolean>,
  system: UnitSystem,
): WeatherLimits {
  const body = JSON.parse(JSON.stringify(loaded)) as Record<string, unknown>;
  for (const row of LIMIT_ROWS) {
    const typed = shown[row.control];
    setAt(body, row.key, typed === null || typed === undefined ? null : siValue(typed, base[row.control], row.quantity, system));
  }
  for (const t of LIMIT_TABLES) setAt(body, blockingKey(t.operation), blocking[blockingControl(t.operation)]);
  return body as unknown as WeatherLimits;
}
