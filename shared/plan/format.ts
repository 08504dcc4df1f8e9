import { formatLength, formatWidth } from '../figures';

// The planner's messages write figures through shared/figures.ts, with the same decimals as every
// screen, e-mail and CSV file. The planner does not know the farm's units, so a length reads in
// both: feet first (the unit most of our farms work in), then metres.

/**
 * A working width (or a whole number of widths) in feet and metres: 0.1 ft and 0.01 m.
 *
 * @param m width in metres
 * @example widthText(18.288) // '60.0 ft / 18.29 m'
 */
export const widthText = (m: number): string => `${formatWidth(m, 'us')} / ${formatWidth(m, 'metric')}`;

/**
 * A distance across a field in whole feet and whole metres.
 *
 * @param m distance in metres
 * @example lengthText(1138) // '3,734 ft / 1,138 m'
 */
export const lengthText = (m: number): string => `${formatLength(m, 'us')} / ${formatLength(m, 'metric')}`;

/** "field 'North Quarter'" or "the field". */
export const fieldName = (label?: string): string => (label ? `field '${label}'` : 'the field');
