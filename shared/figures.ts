/**
 * One way to show a figure: every acre, hectare, hour, width and speed that a person reads (screens,
 * e-mails, CSV files) is written by a function of this file, so the same stored value reads the same
 * everywhere.
 *
 * Rules:
 * - Values are stored as the API keeps them (areas in acres, lengths in metres, plan speeds in
 *   metres per second) and converted for display only; nothing here is ever saved back.
 * - Each kind of figure has one fixed number of decimals, {@link FIGURE_DECIMALS}: areas 0.1, hours
 *   0.1 (worked, planned and engine hours alike), widths 0.1 ft or 0.01 m, speeds 0.1 mph or km/h,
 *   lengths on the ground (hazard clearances) whole ft or whole m.
 * - Rounding is half away from zero (ECMA-402 `roundingMode: 'halfExpand'`, the default of
 *   `Intl.NumberFormat`) of the number as it is written out (the shortest decimal that reads back
 *   as the stored double): 0.25 ac reads "0.3 ac", −0.25 reads "−0.3", 822.65 reads "822.7" (where
 *   `toFixed(1)` gives "822.6" from the binary 822.649 999…). A value that rounds to zero reads
 *   without a minus sign. Round nothing before calling these: rounding twice moves figures.
 * - Text for people groups thousands with commas ("1,234.5 ac"); a CSV number column holds the
 *   same digits without grouping ({@link csvNumber}, "1234.5") so a spreadsheet reads a number, with
 *   the same decimals as the screen.
 * - A missing or non-finite value reads "—".
 * - Crop names read in sentence case ("Spring wheat"), whatever case they were typed in.
 * - Weather figures (temperature, Delta T, wind and gusts, rain, chance of rain) and headings have
 *   their own decimals here too: the forecast strip on a screen and a verdict's reasons from the
 *   server write the same hour with the same digits and unit words.
 */
import type { UnitSystem } from './schemas/auth';
import { acresToHa, cDiffToF, cToF, kmhToMph, MILE_M, mmToIn, mpsToKmh, mpsToMph, mToFt } from './units';

/** Decimals of each kind of figure, the same on screens, in e-mails and in CSV files. */
export const FIGURE_DECIMALS = {
  /** Acres or hectares, and rates per hour of them. */
  area: 1,
  /** Hours worked, planned, booked, and engine hours. */
  hours: 1,
  widthFt: 1,
  widthM: 2,
  /** mph or km/h. */
  speed: 1,
  /** Clearances around hazards and other distances on the ground, whole ft or whole m. */
  length: 0,
  /** Distances driven (a pass plan's passes and headland laps), 0.1 mi or 0.1 km. */
  distance: 1,
  /** A share in per cent (a chance of rain, humidity, cloud cover). */
  percent: 0,
  count: 0,
  /** °F or °C, air or soil temperatures and differences of them (Delta T, dew spread). */
  temperature: 1,
  /** Wind and gusts, mph or km/h. */
  wind: 1,
  /** Rain in an hour: 0.01 in (the depth US rain gauges read) or 0.1 mm. */
  rainIn: 2,
  rainMm: 1,
  /** Degrees clockwise from north: a pass plan's heading, a direction of travel. */
  heading: 1,
  /** Latitude and longitude in degrees: 5 decimals, about 1 m on the ground. */
  position: 5,
} as const;

export const NO_FIGURE = '—';

const formats = new Map<string, Intl.NumberFormat>();

/** The shared formatter for `decimals` places, grouped for people or plain for a CSV column. */
function numberFormat(decimals: number, grouped: boolean): Intl.NumberFormat {
  const key = `${decimals}:${grouped}`;
  let f = formats.get(key);
  if (!f) {
    f = new Intl.NumberFormat('en-US', {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
      roundingMode: 'halfExpand',
      signDisplay: 'negative',
      useGrouping: grouped,
    });
    formats.set(key, f);
  }
  return f;
}

const known = (n: number | null | undefined): n is number => typeof n === 'number' && Number.isFinite(n);

/**
 * A number with `decimals` places and thousands grouped, for people; "—" when there is none.
 * @example figure(1234.56, 1) // '1,234.6'
 */
export function figure(n: number | null | undefined, decimals: number): string {
  return known(n) ? numberFormat(decimals, true).format(n) : NO_FIGURE;
}

/**
 * A number for a CSV column: the same digits as {@link figure}, without grouping; empty when none.
 * @example csvNumber(1234.56, 1) // '1234.6'
 */
export function csvNumber(n: number | null | undefined, decimals: number): string {
  return known(n) ? numberFormat(decimals, false).format(n) : '';
}

/** An area in the farm's unit as a number: acres (US) or hectares (metric). */
export const areaIn = (acres: number, system: UnitSystem): number => (system === 'metric' ? acresToHa(acres) : acres);

/** The area unit's short name: "ac" or "ha". */
export const areaUnit = (system: UnitSystem): 'ac' | 'ha' => (system === 'metric' ? 'ha' : 'ac');

/**
 * Acres, one decimal.
 * @example formatAcres(822.66) // '822.7 ac'
 */
export function formatAcres(acres: number | null | undefined): string {
  return known(acres) ? `${figure(acres, FIGURE_DECIMALS.area)} ac` : NO_FIGURE;
}

/**
 * Hectares, one decimal.
 * @example formatHectares(64.75) // '64.8 ha'
 */
export function formatHectares(ha: number | null | undefined): string {
  return known(ha) ? `${figure(ha, FIGURE_DECIMALS.area)} ha` : NO_FIGURE;
}

/**
 * An area stored in acres, in the farm's unit.
 * @example formatArea(640, 'metric') // '259.0 ha'
 */
export function formatArea(acres: number | null | undefined, system: UnitSystem): string {
  if (!known(acres)) return NO_FIGURE;
  return system === 'metric' ? formatHectares(acresToHa(acres)) : formatAcres(acres);
}

/**
 * Hours (worked, planned, booked), one decimal.
 * @example formatHours(55.18) // '55.2 h'
 */
export function formatHours(hours: number | null | undefined): string {
  return known(hours) ? `${figure(hours, FIGURE_DECIMALS.hours)} h` : NO_FIGURE;
}

/**
 * A quantity billed on an invoice line (acres or hours, kept to 4 decimals as the line stores it),
 * with every decimal its amount was worked from: at least 2, up to 4, zeros past the second
 * dropped, so the figure shown × the rate is the line's amount before its one rounding. With
 * `unit`: followed by "ac" or "h".
 * @example billedQuantity(100.25, 'acre') // '100.25 ac' (not '100.3 ac': 100.3 × $12.50 ≠ $1,253.13)
 * @example billedQuantity(118.4567) // '118.4567'
 * @example billedQuantity(40, 'hour') // '40.00 h'
 */
export function billedQuantity(quantity: number, unit?: 'acre' | 'hour'): string {
  if (!known(quantity)) return NO_FIGURE;
  const digits = figure(quantity, 4).replace(/(\.\d\d\d*?)0+$/, '$1');
  return unit ? `${digits} ${unit === 'acre' ? 'ac' : 'h'}` : digits;
}

/**
 * How long ago something was fetched or sent (a forecast's age): whole minutes under an hour, then
 * hours with the one decimal every hour figure has. A negative age (clocks a little apart) reads 0 min.
 * @example formatAge(25) // '25 min'; formatAge(150) // '2.5 h'; formatAge(120) // '2.0 h'
 */
export function formatAge(minutes: number | null | undefined): string {
  if (!known(minutes)) return NO_FIGURE;
  const m = Math.max(0, minutes);
  // 59.6 min would read "60 min": from there on it reads in hours.
  return m < 59.5 ? `${figure(m, FIGURE_DECIMALS.count)} min` : formatHours(m / 60);
}

/**
 * An hour meter's reading or a difference of readings, one decimal (meters read tenths).
 * @example formatEngineHours(1234.56) // '1,234.6 h'
 */
export const formatEngineHours = formatHours;

/**
 * Engine power, whole horsepower (as machines and implement needs are kept).
 * @example formatPower(250) // '250 hp'
 */
export function formatPower(hp: number | null | undefined): string {
  return known(hp) ? `${figure(hp, FIGURE_DECIMALS.count)} hp` : NO_FIGURE;
}

/**
 * A working width stored in metres: feet to 0.1 (US), metres to 0.01 (metric).
 * @example formatWidth(18.288, 'us') // '60.0 ft'; formatWidth(18.288, 'metric') // '18.29 m'
 */
export function formatWidth(widthM: number | null | undefined, system: UnitSystem): string {
  if (!known(widthM)) return NO_FIGURE;
  return system === 'metric' ? `${figure(widthM, FIGURE_DECIMALS.widthM)} m` : `${figure(mToFt(widthM), FIGURE_DECIMALS.widthFt)} ft`;
}

/**
 * A length on the ground stored in metres (a hazard's clearance): whole feet (US) or whole metres
 * (metric). A clearance is paced or eyed in the field, so tenths would claim a care nobody takes.
 * @example formatLength(30.48, 'us') // '100 ft'; formatLength(30.48, 'metric') // '30 m'
 */
export function formatLength(metres: number | null | undefined, system: UnitSystem): string {
  if (!known(metres)) return NO_FIGURE;
  return system === 'metric' ? `${figure(metres, FIGURE_DECIMALS.length)} m` : `${figure(mToFt(metres), FIGURE_DECIMALS.length)} ft`;
}

/**
 * A working speed stored in metres per second: mph (US) or km/h (metric), one decimal.
 * @example formatSpeed(2.2352, 'us') // '5.0 mph'; formatSpeed(2.2352, 'metric') // '8.0 km/h'
 */
export function formatSpeed(mps: number | null | undefined, system: UnitSystem): string {
  if (!known(mps)) return NO_FIGURE;
  return system === 'metric'
    ? `${figure(mpsToKmh(mps), FIGURE_DECIMALS.speed)} km/h`
    : `${figure(mpsToMph(mps), FIGURE_DECIMALS.speed)} mph`;
}

/**
 * A distance driven, stored in metres: miles (US) or kilometres (metric), one decimal.
 * @example formatDistance(1609.344, 'us') // '1.0 mi'; formatDistance(1609.344, 'metric') // '1.6 km'
 */
export function formatDistance(metres: number | null | undefined, system: UnitSystem): string {
  if (!known(metres)) return NO_FIGURE;
  return system === 'metric'
    ? `${figure(metres / 1000, FIGURE_DECIMALS.distance)} km`
    : `${figure(metres / MILE_M, FIGURE_DECIMALS.distance)} mi`;
}

/**
 * A work rate: acres per hour (US) or hectares per hour (metric), with the decimals of an area.
 * The plan works both out from its own rule (ac/h and ha/h each from its published formula), so
 * the caller gives the one for the farm's unit.
 * @example formatAreaRate(51.46, 'us') // '51.5 ac/h'; formatAreaRate(20.83, 'metric') // '20.8 ha/h'
 */
export function formatAreaRate(perHour: number | null | undefined, system: UnitSystem): string {
  return known(perHour) ? `${figure(perHour, FIGURE_DECIMALS.area)} ${areaUnit(system)}/h` : NO_FIGURE;
}

/**
 * A count of things (passes, turns, laps, seconds), whole and grouped; "—" when there is none.
 * @example formatCount(1234) // '1,234'
 */
export const formatCount = (n: number | null | undefined): string => figure(n, FIGURE_DECIMALS.count);

/**
 * A crop name in sentence case, spaces tidied: the one style of crop names everywhere. Null for none.
 * @example cropName('  spring   WHEAT ') // 'Spring wheat'
 */
export function cropName(crop: string | null | undefined): string | null {
  const tidy = crop?.trim().replace(/\s+/g, ' ').toLowerCase();
  return tidy ? tidy.charAt(0).toUpperCase() + tidy.slice(1) : null;
}

/** The kinds of weather figure, each in the farm's units on every screen and in every message. */
export type WeatherFigure = 'temperature' | 'difference' | 'wind' | 'rain';

/** How one kind of weather figure reads in a unit system: its unit's words and decimals. */
export interface WeatherUnit {
  /** Written after the number, after a space ("°F", "mph", "in"). */
  unit: string;
  decimals: number;
  /** From the unit the API keeps (°C, km/h, mm) to the unit shown. */
  convert: (si: number) => number;
}

const same = (n: number): number => n;
const WEATHER_UNITS: Record<UnitSystem, Record<WeatherFigure, WeatherUnit>> = {
  us: {
    temperature: { unit: '°F', decimals: FIGURE_DECIMALS.temperature, convert: cToF },
    // A difference of temperatures scales by 9/5 without the 32 (NIST SP 811, B.8).
    difference: { unit: '°F', decimals: FIGURE_DECIMALS.temperature, convert: cDiffToF },
    wind: { unit: 'mph', decimals: FIGURE_DECIMALS.wind, convert: kmhToMph },
    rain: { unit: 'in', decimals: FIGURE_DECIMALS.rainIn, convert: mmToIn },
  },
  metric: {
    temperature: { unit: '°C', decimals: FIGURE_DECIMALS.temperature, convert: same },
    difference: { unit: '°C', decimals: FIGURE_DECIMALS.temperature, convert: same },
    wind: { unit: 'km/h', decimals: FIGURE_DECIMALS.wind, convert: same },
    rain: { unit: 'mm', decimals: FIGURE_DECIMALS.rainMm, convert: same },
  },
};

/** The unit words and decimals of a kind of weather figure in a unit system. */
export const weatherUnit = (kind: WeatherFigure, system: UnitSystem): WeatherUnit => WEATHER_UNITS[system][kind];

/**
 * A weather figure without its unit, for a table whose header names the unit: "18.6".
 * @param si the value as the API keeps it: °C, km/h or mm
 * @example weatherNumber(30, 'wind', 'us') // '18.6'
 */
export function weatherNumber(si: number | null | undefined, kind: WeatherFigure, system: UnitSystem): string {
  if (!known(si)) return NO_FIGURE;
  const u = weatherUnit(kind, system);
  return figure(u.convert(si), u.decimals);
}

function weatherText(si: number | null | undefined, kind: WeatherFigure, system: UnitSystem): string {
  return known(si) ? `${weatherNumber(si, kind, system)} ${weatherUnit(kind, system).unit}` : NO_FIGURE;
}

/**
 * An air or soil temperature stored in °C: °F (US) or °C (metric), one decimal.
 * @example formatTemperature(20, 'us') // '68.0 °F'
 */
export const formatTemperature = (c: number | null | undefined, system: UnitSystem): string => weatherText(c, 'temperature', system);

/**
 * A difference of temperatures stored in °C (Delta T, a dew spread): 9/5 of it in °F, no 32.
 * @example formatTemperatureDifference(5, 'us') // '9.0 °F'
 */
export const formatTemperatureDifference = (c: number | null | undefined, system: UnitSystem): string =>
  weatherText(c, 'difference', system);

/**
 * A wind or gust speed stored in km/h (as forecasts give it): mph (US) or km/h (metric), one decimal.
 * Working speeds, stored in m/s, read through {@link formatSpeed}.
 * @example formatWind(30, 'us') // '18.6 mph'
 */
export const formatWind = (kmh: number | null | undefined, system: UnitSystem): string => weatherText(kmh, 'wind', system);

/**
 * Rain (precipitation) stored in mm: inches to 0.01 (US) or mm to 0.1 (metric).
 * @example formatRain(2.5, 'us') // '0.10 in'; formatRain(2.5, 'metric') // '2.5 mm'
 */
export const formatRain = (mm: number | null | undefined, system: UnitSystem): string => weatherText(mm, 'rain', system);

/**
 * A share in per cent, whole: a chance of rain, humidity, cloud cover.
 * @example formatPercent(49.6) // '50 %'
 */
export function formatPercent(pct: number | null | undefined): string {
  return known(pct) ? `${figure(pct, FIGURE_DECIMALS.percent)} %` : NO_FIGURE;
}

/**
 * A heading in degrees clockwise from north, one decimal, within one turn: a pass plan's lines
 * (`turn` 180, as 0° and 180° drive the same lines) or a direction of travel (`turn` 360).
 * @example formatHeading(81.37, 180) // '81.4°'; formatHeading(179.97, 180) // '0.0°'; formatHeading(-90) // '270.0°'
 */
export function formatHeading(deg: number | null | undefined, turn: 180 | 360 = 360): string {
  if (!known(deg)) return NO_FIGURE;
  const text = figure(((deg % turn) + turn) % turn, FIGURE_DECIMALS.heading);
  // 179.97 in a half turn rounds to "180.0", which is 0°.
  return `${text === figure(turn, FIGURE_DECIMALS.heading) ? figure(0, FIGURE_DECIMALS.heading) : text}°`;
}

const COMPASS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;
export type CompassPoint = (typeof COMPASS)[number];
const COMPASS_WORDS: Record<CompassPoint, string> = {
  N: 'north',
  NE: 'north-east',
  E: 'east',
  SE: 'south-east',
  S: 'south',
  SW: 'south-west',
  W: 'west',
  NW: 'north-west',
};

/**
 * Where the wind blows from, as one of eight compass points (meteorological convention, WMO No. 8).
 * @example compassPoint(200) // 'S'
 */
export function compassPoint(deg: number | null | undefined): CompassPoint | null {
  if (!known(deg)) return null;
  return COMPASS[Math.round((((deg % 360) + 360) % 360) / 45) % 8];
}

/**
 * The compass point in words, for a sentence or a screen reader.
 * @example compassWords(225) // 'from the south-west'
 */
export function compassWords(deg: number | null | undefined): string {
  const c = compassPoint(deg);
  return c === null ? 'direction unknown' : `from the ${COMPASS_WORDS[c]}`;
}

/**
 * The way a pass plan's passes run, heading and words both: a pass is driven up and back, so its
 * line runs between a compass point and the opposite one (nearest of eight, 45° apart).
 * @example formatPassHeading(90) // '90.0° (east–west)'
 * @example formatPassHeading(0) // '0.0° (north–south)'
 */
export function formatPassHeading(deg: number | null | undefined): string {
  if (!known(deg)) return NO_FIGURE;
  const ways = ['north–south', 'north-east–south-west', 'east–west', 'south-east–north-west'];
  return `${formatHeading(deg, 180)} (${ways[Math.round((((deg % 180) + 180) % 180) / 45) % 4]})`;
}

/**
 * A lon/lat position as a farmer reads it: "47.61234° N, 99.91234° W" (5 decimals ≈ 1 m).
 * @param lon longitude in degrees (east positive)
 * @param lat latitude in degrees (north positive)
 * @example formatLatLon(-99.91234, 47.61234) // '47.61234° N, 99.91234° W'
 */
export function formatLatLon(lon: number, lat: number): string {
  const ns = lat >= 0 ? 'N' : 'S';
  const ew = lon >= 0 ? 'E' : 'W';
  return `${figure(Math.abs(lat), FIGURE_DECIMALS.position)}° ${ns}, ${figure(Math.abs(lon), FIGURE_DECIMALS.position)}° ${ew}`;
}
