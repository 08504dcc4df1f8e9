// Field capacity after Hancock, Swetnam & Benson, "Calculating Farm Machinery Field Capacities",
// AEN-73, University of Kentucky (1991), and its metric form from GRDC (Australia).
//
// Plans keep their width in metres and their speed in metres per second; the planner's figures come
// from those SI values (fieldCapacityAcPerH, fieldCapacityHaPerH): the area swept in an hour,
// width × speed × 3,600 s, times the field efficiency. The published forms below (ft and mph ÷ 8.25,
// km/h and m ÷ 10) are the same quantity in other units; the spec checks the SI functions against
// the worked examples given in those forms.
import { HOUR_S, m2ToAcres, m2ToHa } from '../units';

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

/**
 * Effective field capacity from a plan's stored SI values, ac/h: width × speed × 3,600 s swept in an
 * hour, in acres, times the field efficiency (the AEN-73 rule without its 8.25, which is only this
 * conversion for feet and mph).
 *
 * @param widthM working width, metres
 * @param speedMps working speed, metres per second
 * @param efficiency field efficiency, 0–1
 * @returns acres per hour
 * @example fieldCapacityAcPerH(12.192, 2.68224, 0.7) // ≈ 20.4 (40 ft at 6 mph, 70 %: Iowa State PM 696)
 */
export function fieldCapacityAcPerH(widthM: number, speedMps: number, efficiency: number): number {
  return m2ToAcres(widthM * speedMps * HOUR_S) * efficiency;
}

/**
 * Effective field capacity from a plan's stored SI values, ha/h (the GRDC form's quantity).
 *
 * @param widthM working width, metres
 * @param speedMps working speed, metres per second
 * @param efficiency field efficiency, 0–1
 * @returns hectares per hour
 * @example fieldCapacityHaPerH(12, 10 / 3.6, 0.8) // 9.6 (12 m at 10 km/h, 80 %)
 */
export function fieldCapacityHaPerH(widthM: number, speedMps: number, efficiency: number): number {
  return m2ToHa(widthM * speedMps * HOUR_S) * efficiency;
}
