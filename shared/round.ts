/**
 * Rounds to a number of decimal places, for figures shown to people (acres to 0.01, hours to 0.1).
 * @example roundTo(12.345, 2) // 12.35
 */
export const roundTo = (n: number, digits = 2): number => Math.round(n * 10 ** digits) / 10 ** digits;
