// The run sheet's weather words that are not figures. Every figure (temperature, wind, rain,
// chance, Delta T, the forecast's age) is written by shared/figures.ts, as the server writes them
// in a verdict's reasons.
import { farmTime } from '@shared/farm-time';
import { formatAge } from '@shared/figures';

/** 'HH:MM' of an ISO time in a zone (the farm's). */
export const clockIn = (iso: string, timeZone: string | undefined): string => farmTime(iso, timeZone);

/** How old the forecast is, written as every forecast age is (shared/figures.ts): '2.0 h old', '25 min old'. */
export const ageOf = (minutes: number): string => `${formatAge(minutes)} old`;
