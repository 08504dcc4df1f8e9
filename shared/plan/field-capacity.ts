// Field capacity after Hancock, Swetnam & Benson, "Calculating Farm Machinery Field Capacities",
// AEN-73, University of Kentucky (1991), and its metric form from GRDC (Australia).

/** 43,560 ft² per acre ÷ 5,280 ft per mile (AEN-73). */
export const ACRE_MPH_FT = 43_560 / 5_280; // 8.25

/**
 * Theoretical field capacity: the area covered at full width and speed with no stops, ac/h.
 *
 * @param widthFt working width, feet
 * @param speedMph working speed, mph
 * @returns acres per hour
 * @example theoreticalCapacityAcPerH(70, 8.3) // ≈ 70.4
 */
export function theoreticalCapacityAcPerH(widthFt: number, speedMph: number): number {
  return (widthFt * speedMph) / ACRE_MPH_FT;
}

/**
 * Effective field capacity = theoretical × field efficiency (AEN-73), ac/h.
 *
 * @param widthFt working width, feet
 * @param speedMph working speed, mph
 * @param efficiency field efficiency, 0–1
 * @returns acres per hour
 * @example effectiveCapacityAcPerH(40, 6, 0.7) // ≈ 20.4 (Iowa State PM 696 spreader example)
 */
export function effectiveCapacityAcPerH(widthFt: number, speedMph: number, efficiency: number): number {
  return theoreticalCapacityAcPerH(widthFt, speedMph) * efficiency;
}

/**
 * Effective field capacity in metric units: speed (km/h) × width (m) × efficiency / 10, ha/h (GRDC).
 *
 * @param widthM working width, metres
 * @param speedKmh working speed, km/h
 * @param efficiency field efficiency, 0–1
 * @returns hectares per hour
 * @example effectiveCapacityHaPerH(12, 10, 0.8) // 9.6
 */
export function effectiveCapacityHaPerH(widthM: number, speedKmh: number, efficiency: number): number {
  return (speedKmh * widthM * efficiency) / 10;
}
