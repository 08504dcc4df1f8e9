import { formatHours } from '@shared/figures';
import { dayIn } from '@shared/calendar';

/** A day as the API writes it (YYYY-MM-DD), in the browser's own calendar, not UTC. */
export function isoDay(date: Date): string {
  const y = date.getFullYear();
  const m = String(date.getMonth() + 1).padStart(2, '0');
  const d = String(date.getDate()).padStart(2, '0');
  return `${y}-${m}-${d}`;
}

/** The local midnight of a YYYY-MM-DD day. */
export function dateOf(day: string): Date {
  const [y, m, d] = day.split('-').map(Number);
  return new Date(y, m - 1, d);
}

/** True for a real calendar day written YYYY-MM-DD. */
export function isIsoDay(value: unknown): value is string {
  if (typeof value !== 'string' || !/^\d{4}-\d{2}-\d{2}$/.test(value)) return false;
  return isoDay(dateOf(value)) === value;
}

/** The day `n` days after `day` (before, when negative). */
export function addDays(day: string, n: number): string {
  const date = dateOf(day);
  date.setDate(date.getDate() + n);
  return isoDay(date);
}

/** Today at the farm (its time zone); the browser's own calendar when the zone is not known. */
export const today = (timeZone?: string, now = new Date()): string => (timeZone ? dayIn(timeZone, now) : isoDay(now));
/** Tomorrow at the farm: the day the evening's planning is for. */
export const tomorrow = (timeZone?: string, now = new Date()): string => addDays(today(timeZone, now), 1);

const LONG = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', year: 'numeric' });

const SHORT = new Intl.DateTimeFormat('en-US', { weekday: 'short', month: 'long', day: 'numeric' });

/** "Tue, April 20". */
export const shortDay = (day: string): string => SHORT.format(dateOf(day));

/** "Thursday, May 15, 2031". */
export const longDay = (day: string): string => LONG.format(dateOf(day));

/** Hours to one decimal, as "5.4 h" or "5.0 h": the shared figure the work-order e-mail writes too. */
export const hoursText = (hours: number): string => formatHours(hours);
