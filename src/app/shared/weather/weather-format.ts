// The run sheet's weather in the farm's units (°F / mph / in for 'us', °C / km/h / mm for metric),
// converted through shared/units.ts; the API answers in SI.
import type { UnitSystem } from '@shared/schemas/auth';
import { roundTo } from '@shared/round';
import { cDiffToF, cToF, kmhToMph, mmToIn } from '@shared/units';

const COMPASS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;
const COMPASS_WORDS: Record<(typeof COMPASS)[number], string> = {
  N: 'north',
  NE: 'north-east',
  E: 'east',
  SE: 'south-east',
  S: 'south',
  SW: 'south-west',
  W: 'west',
  NW: 'north-west',
};

/** A temperature, whole degrees: 20 °C → '68 °F' (us) or '20 °C'. */
export const temperatureOf = (c: number | null, units: UnitSystem): string =>
  c === null ? '—' : units === 'us' ? `${Math.round(cToF(c))} °F` : `${Math.round(c)} °C`;

/** A speed, whole units: 30 km/h → '19 mph' (us) or '30 km/h'. */
export const speedOf = (kmh: number | null, units: UnitSystem): string =>
  kmh === null ? '—' : units === 'us' ? `${Math.round(kmhToMph(kmh))} mph` : `${Math.round(kmh)} km/h`;

/** A rain amount: 2.5 mm → '0.1 in' (us, to 0.01 in) or '2.5 mm'. */
export const rainOf = (mm: number | null, units: UnitSystem): string =>
  mm === null ? '—' : units === 'us' ? `${roundTo(mmToIn(mm), 2)} in` : `${roundTo(mm, 1)} mm`;

/** A temperature difference (Delta T), one decimal: 5 °C → '9 °F' (us) or '5 °C'. */
export const deltaTOf = (c: number | null, units: UnitSystem): string =>
  c === null ? '—' : units === 'us' ? `${roundTo(cDiffToF(c), 1)} °F` : `${roundTo(c, 1)} °C`;

/** Where the wind blows from, as one of eight compass points: 200° → 'S', 350° → 'N'. */
export function compassOf(deg: number | null): (typeof COMPASS)[number] | null {
  if (deg === null || !Number.isFinite(deg)) return null;
  return COMPASS[Math.round((((deg % 360) + 360) % 360) / 45) % 8];
}

/** The compass point in words for a screen reader: 'from the south-west'. */
export const compassWords = (deg: number | null): string => {
  const c = compassOf(deg);
  return c === null ? 'direction unknown' : `from the ${COMPASS_WORDS[c]}`;
};

/** 'HH:MM' of an ISO time in a zone (the farm's). */
export function clockIn(iso: string, timeZone: string | undefined): string {
  return new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone }).format(new Date(iso));
}

/** How old the forecast is: '2 h old', '25 min old'. */
export function ageOf(minutes: number): string {
  if (minutes < 60) return `${minutes} min old`;
  return `${roundTo(minutes / 60, minutes < 600 ? 1 : 0)} h old`;
}
