import { roundTo } from '../round';
import { mToFt } from '../units';

/**
 * A length in feet as a farmer reads it: whole feet, or one decimal below 10 ft.
 *
 * @param m length in metres
 * @example feet(18.288) // '60 ft'
 */
export function feet(m: number): string {
  const ft = mToFt(m);
  const rounded = roundTo(ft, Math.abs(ft) < 10 ? 1 : 0);
  return `${rounded} ft`;
}

/** "field 'North Quarter'" or "the field". */
export const fieldName = (label?: string): string => (label ? `field '${label}'` : 'the field');
