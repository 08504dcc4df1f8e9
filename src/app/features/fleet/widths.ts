import type { UnitSystem } from '@shared/schemas/auth';
import { roundTo } from '@shared/round';
import { formatWidth as sharedWidth } from '@shared/figures';
import { ftToM, mToFt } from '@shared/units';

// Implement widths keep more precision than the units helper's whole feet or metres: a 60 ft drill
// is 18.288 m, and a pass plan built on "18 m" would leave a skip on every pass.

/**
 * A width typed in the farm's unit, in metres for the API (exact for feet, to the micrometre).
 * @param value width in feet (US) or metres (metric)
 * @example widthToMetres(84, 'us') // 25.6032
 */
export function widthToMetres(value: number, system: UnitSystem): number {
  const m = system === 'metric' ? value : ftToM(value);
  return roundTo(m, 6);
}

/**
 * A stored width in the farm's unit for a form field: feet to 0.01, metres to 0.001.
 * @param widthM width in metres
 * @example metresToWidth(25.6032, 'us') // 84
 */
export function metresToWidth(widthM: number, system: UnitSystem): number {
  return system === 'metric' ? roundTo(widthM, 3) : roundTo(mToFt(widthM), 2);
}

/**
 * A width for tables: feet to 0.1, metres to 0.01, as the work-order e-mail writes it (shared/figures.ts).
 * @param widthM width in metres, or null when not known
 * @example formatWidth(18.288, 'us') // '60.0 ft'; formatWidth(18.288, 'metric') // '18.29 m'
 */
export const formatWidth = (widthM: number | null | undefined, system: UnitSystem): string => sharedWidth(widthM, system);
