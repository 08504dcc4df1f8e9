// Go / caution / no-go per operation and hour, one pure function per rule family, so the browser
// and the server judge alike. Each takes the forecast hours (in time order, one per hour), the
// index of the hour judged, the family's limits and the farm's units (for the words only).
//
// Precipitation of an hour is the forecast's sum over the hour before its time (as the forecast
// service gives it), so "rain at 14:00" is rain between 13:00 and 14:00.
import type { UnitSystem } from '../schemas/auth';
import { formatHours, formatPercent, formatRain, formatTemperature, formatTemperatureDifference, formatWind } from '../figures';
import {
  SPRAY_LABEL_CAUTION,
  type HarrowingLimits,
  type HarvestLimits,
  type SeedCrop,
  type SeedingLimits,
  type SprayingLimits,
  type WeatherLimits,
  type WeatherOperation,
  WEATHER_OPERATIONS,
} from './limits';
import { inversionHours, type InversionHours, type Place } from './sun';
import { deltaTC } from './wet-bulb';

/** One forecast hour as the rules read it (the API's hour without its verdicts). */
export interface WeatherHour {
  /** ISO 8601 with the farm's offset: 2026-05-14T10:00:00-05:00. */
  time: string;
  temperatureC: number | null;
  relativeHumidityPct: number | null;
  dewPointC: number | null;
  precipitationMm: number | null;
  precipitationProbabilityPct: number | null;
  windSpeedKmh: number | null;
  windGustKmh: number | null;
  windDirectionDeg: number | null;
  cloudCoverPct: number | null;
  soilTemperatureC: number | null;
}

export type VerdictLevel = 'go' | 'caution' | 'no-go';
export interface Verdict {
  verdict: VerdictLevel;
  /** Why, worst first, in words a farmer reads ("wind 14 mph at 10:00, above the spraying limit of 10 mph"). */
  reasons: string[];
}

const RANK: Record<VerdictLevel, number> = { go: 0, caution: 1, 'no-go': 2 };

/** The hour of a time written with its offset: "10:00" of 2026-05-14T10:00:00-05:00 (the farm's clock). */
export const clockOf = (time: string): string => time.slice(11, 16);
/** An instant (ms) on the clock of a time written with its offset ("+02:00", "-05:00" or "Z"): "21:32". */
export function clockAt(ms: number, time: string): string {
  const m = /([+-])(\d\d):(\d\d)$/.exec(time);
  const offsetMin = m ? (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
  return new Date(Math.round((ms + offsetMin * 60_000) / 60_000) * 60_000).toISOString().slice(11, 16);
}

/** Every figure in a reason is written by shared/figures.ts, as the screens write the forecast hours. */
const speedText = formatWind;
const temperatureText = formatTemperature;
const differenceText = formatTemperatureDifference;
const rainText = formatRain;

/** Collects reasons by level and gives the verdict: the worst level, its reasons first. */
class Judgement {
  private readonly noGo: string[] = [];
  private readonly caution: string[] = [];
  no(reason: string): void {
    this.noGo.push(reason);
  }
  careful(reason: string): void {
    this.caution.push(reason);
  }
  verdict(): Verdict {
    const verdict: VerdictLevel = this.noGo.length ? 'no-go' : this.caution.length ? 'caution' : 'go';
    return { verdict, reasons: [...this.noGo, ...this.caution] };
  }
}

const isRain = (h: WeatherHour | undefined, mm: number): h is WeatherHour => !!h && h.precipitationMm !== null && h.precipitationMm >= mm;

/** The last hour before `i`, within `hoursBack` of it, that had rain; null when none. */
function rainBefore(hours: readonly WeatherHour[], i: number, hoursBack: number, mm: number): WeatherHour | null {
  for (let j = i - 1; j >= Math.max(0, i - hoursBack); j--) if (isRain(hours[j], mm)) return hours[j];
  return null;
}

/** Why the hour is in the inversion window, with the sun's time on the hour's own clock. */
function inversionWhen(when: Exclude<InversionHours, { inside: false }>, time: string, lim: SprayingLimits): string {
  if (when.side === 'polar-night') return 'the sun does not rise today';
  if (when.side === 'evening') return `from ${formatHours(lim.inversionBeforeSunsetHours)} before sunset (${clockAt(when.sunset, time)})`;
  return `until ${formatHours(lim.inversionAfterSunriseHours)} after sunrise (${clockAt(when.sunrise, time)})`;
}

/**
 * Spraying: wind inside the label window, no rain from the hour through `rainFreeHours` after it,
 * Delta T in the good band, no inversion risk (light wind under clear sky from some hours before
 * sunset at `place` until some hours after sunrise). Always ends with SPRAY_LABEL_CAUTION.
 */
export function judgeSpraying(hours: readonly WeatherHour[], i: number, lim: SprayingLimits, units: UnitSystem, place: Place): Verdict {
  const h = hours[i];
  const at = clockOf(h.time);
  const j = new Judgement();
  const wind = h.windSpeedKmh;
  if (wind === null) j.careful(`no wind forecast at ${at}`);
  else {
    if (wind < lim.inversionWindKmh && h.cloudCoverPct !== null && h.cloudCoverPct <= lim.inversionCloudMaxPct) {
      const when = inversionHours(Date.parse(h.time), place, lim.inversionBeforeSunsetHours, lim.inversionAfterSunriseHours);
      if (when.inside)
        j.no(
          `inversion risk at ${at}: wind ${speedText(wind, units)} under clear sky (${formatPercent(h.cloudCoverPct)} cloud), ${inversionWhen(when, h.time, lim)}`,
        );
    }
    if (wind > lim.windMaxKmh)
      j.no(`wind ${speedText(wind, units)} at ${at}, above the spraying limit of ${speedText(lim.windMaxKmh, units)}`);
    else if (wind < lim.windMinKmh)
      j.no(`wind ${speedText(wind, units)} at ${at}, below the spraying minimum of ${speedText(lim.windMinKmh, units)}`);
    if (h.windGustKmh !== null && h.windGustKmh > lim.windMaxKmh && wind <= lim.windMaxKmh)
      j.careful(`gusts ${speedText(h.windGustKmh, units)} at ${at}, above the spraying limit of ${speedText(lim.windMaxKmh, units)}`);
  }
  // Rain in this hour or the rain-free hours after it.
  let rainSeen = false;
  for (let k = i; k <= i + lim.rainFreeHours && k < hours.length; k++) {
    const r = hours[k];
    if (isRain(r, lim.rainMm)) {
      j.no(
        `rain ${rainText(r.precipitationMm!, units)} at ${clockOf(r.time)}, within ${formatHours(lim.rainFreeHours)} of spraying at ${at}`,
      );
      rainSeen = true;
      break;
    }
  }
  if (!rainSeen) {
    for (let k = i; k <= i + lim.rainFreeHours && k < hours.length; k++) {
      const p = hours[k].precipitationProbabilityPct;
      if (p !== null && p >= lim.rainChanceCautionPct) {
        j.careful(
          `${formatPercent(p)} chance of rain at ${clockOf(hours[k].time)}, within ${formatHours(lim.rainFreeHours)} of spraying at ${at}`,
        );
        break;
      }
    }
  }
  if (h.temperatureC === null || h.relativeHumidityPct === null) j.careful(`no temperature or humidity forecast at ${at} for Delta T`);
  else {
    const dt = deltaTC(h.temperatureC, h.relativeHumidityPct);
    const dtText = `Delta T ${differenceText(dt, units)} at ${at}`;
    if (dt < lim.deltaTMinC) j.no(`${dtText}, under ${differenceText(lim.deltaTMinC, units)}: fine droplets stay airborne and drift`);
    else if (dt > lim.deltaTCautionMaxC)
      j.no(`${dtText}, over ${differenceText(lim.deltaTCautionMaxC, units)}: droplets evaporate before they land`);
    else if (dt > lim.deltaTGoodMaxC) j.careful(`${dtText}, over ${differenceText(lim.deltaTGoodMaxC, units)}: use coarser droplets`);
  }
  const v = j.verdict();
  return { verdict: v.verdict, reasons: [...v.reasons, SPRAY_LABEL_CAUTION] };
}

/** Harrowing straw: no-go in rain, while straw is wet after rain or with dew; caution when cold. */
export function judgeHarrowing(hours: readonly WeatherHour[], i: number, lim: HarrowingLimits, units: UnitSystem): Verdict {
  const h = hours[i];
  const at = clockOf(h.time);
  const j = new Judgement();
  if (isRain(h, lim.rainMm)) j.no(`rain ${rainText(h.precipitationMm!, units)} at ${at}: wet straw does not spread`);
  else {
    const before = rainBefore(hours, i, lim.wetAfterRainHours, lim.rainMm);
    if (before) j.no(`straw still wet at ${at} from rain at ${clockOf(before.time)} (within ${formatHours(lim.wetAfterRainHours)})`);
  }
  if (h.temperatureC !== null && h.dewPointC !== null && h.temperatureC - h.dewPointC <= lim.dewSpreadC)
    j.no(`dew on the straw at ${at}: air ${temperatureText(h.temperatureC, units)}, dew point ${temperatureText(h.dewPointC, units)}`);
  if (h.temperatureC !== null && h.temperatureC < lim.coldBelowC)
    j.careful(
      `cold at ${at}: ${temperatureText(h.temperatureC, units)}, under ${temperatureText(lim.coldBelowC, units)}; straw stays tough`,
    );
  if (h.temperatureC === null) j.careful(`no temperature forecast at ${at}`);
  return j.verdict();
}

/** Seeding: soil at or above the crop's minimum; no-go in heavy rain. `crop` null: no minimum known. */
export function judgeSeeding(
  hours: readonly WeatherHour[],
  i: number,
  lim: SeedingLimits,
  units: UnitSystem,
  crop: SeedCrop | null,
): Verdict {
  const h = hours[i];
  const at = clockOf(h.time);
  const j = new Judgement();
  if (isRain(h, lim.heavyRainMm))
    j.no(`heavy rain ${rainText(h.precipitationMm!, units)} at ${at}, at or above ${rainText(lim.heavyRainMm, units)} in an hour`);
  if (!crop) j.careful('no crop with a soil-temperature minimum is planned on this field this season');
  else if (h.soilTemperatureC === null) j.careful(`no soil temperature forecast at ${at}`);
  else if (h.soilTemperatureC < lim.soilMinC[crop])
    j.no(
      `soil ${temperatureText(h.soilTemperatureC, units)} at ${at}, under the ${crop} minimum of ${temperatureText(lim.soilMinC[crop], units)}`,
    );
  return j.verdict();
}

/** Swathing and combining: no-go in rain and for some hours after it; caution when humid or with dew. */
export function judgeHarvest(
  hours: readonly WeatherHour[],
  i: number,
  lim: HarvestLimits,
  units: UnitSystem,
  operation: 'swathing' | 'combining',
): Verdict {
  const h = hours[i];
  const at = clockOf(h.time);
  const j = new Judgement();
  if (isRain(h, lim.rainMm)) j.no(`rain ${rainText(h.precipitationMm!, units)} at ${at}: no ${operation} in rain`);
  else {
    const before = rainBefore(hours, i, lim.afterRainHours, lim.rainMm);
    if (before) j.no(`crop still wet at ${at} from rain at ${clockOf(before.time)} (within ${formatHours(lim.afterRainHours)})`);
  }
  if (h.relativeHumidityPct !== null && h.relativeHumidityPct >= lim.humidityCautionPct)
    j.careful(
      `humidity ${formatPercent(h.relativeHumidityPct)} at ${at}, at or above ${formatPercent(lim.humidityCautionPct)}: crop may be tough`,
    );
  if (h.temperatureC !== null && h.dewPointC !== null && h.temperatureC - h.dewPointC <= lim.dewSpreadC)
    j.careful(`dew likely at ${at}: air ${temperatureText(h.temperatureC, units)}, dew point ${temperatureText(h.dewPointC, units)}`);
  return j.verdict();
}

export type Verdicts = Record<WeatherOperation, Verdict>;

/**
 * One operation's verdict for hour `i`. `crop`: the field's crop this season, for seeding;
 * `place`: the forecast point, whose sunrise and sunset bound spraying's inversion hours.
 */
export function judgeOperation(
  operation: WeatherOperation,
  hours: readonly WeatherHour[],
  i: number,
  limits: WeatherLimits,
  units: UnitSystem,
  crop: SeedCrop | null,
  place: Place,
): Verdict {
  switch (operation) {
    case 'harrowing':
      return judgeHarrowing(hours, i, limits.harrowing, units);
    case 'seeding':
      return judgeSeeding(hours, i, limits.seeding, units, crop);
    case 'spraying':
      return judgeSpraying(hours, i, limits.spraying, units, place);
    case 'swathing':
      return judgeHarvest(hours, i, limits.swathing, units, 'swathing');
    case 'combining':
      return judgeHarvest(hours, i, limits.combining, units, 'combining');
  }
}

/** Every operation's verdict for hour `i` (see judgeOperation). */
export function judgeHour(
  hours: readonly WeatherHour[],
  i: number,
  limits: WeatherLimits,
  units: UnitSystem,
  crop: SeedCrop | null,
  place: Place,
): Verdicts {
  const v = {} as Verdicts;
  for (const op of WEATHER_OPERATIONS) v[op] = judgeOperation(op, hours, i, limits, units, crop, place);
  return v;
}

/**
 * One verdict for a time window (a card's hours, or the farm's working day): the worst hour's
 * level, with the reasons of the hours at that level in time order (each once). Spraying's label
 * caution stays last. No hours: a caution saying so.
 */
export function judgeWindow(verdicts: readonly Verdict[]): Verdict {
  if (!verdicts.length) return { verdict: 'caution', reasons: ['no forecast for these hours'] };
  const worst = verdicts.reduce<VerdictLevel>((w, v) => (RANK[v.verdict] > RANK[w] ? v.verdict : w), 'go');
  const reasons = new Set<string>();
  for (const v of verdicts) if (v.verdict === worst) for (const r of v.reasons) if (r !== SPRAY_LABEL_CAUTION) reasons.add(r);
  const label = verdicts.some((v) => v.reasons.includes(SPRAY_LABEL_CAUTION));
  return { verdict: worst, reasons: [...reasons, ...(label ? [SPRAY_LABEL_CAUTION] : [])] };
}

export { WEATHER_OPERATIONS };
