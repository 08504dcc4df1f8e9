// Hours of work: the hours a job was underway (from its log) and the hours a person is planned
// on a day (their jobs' spans, overlaps counted once).
import { roundTo } from '../../shared/round';

/**
 * Hours a job was underway: from each start or resume to the next pause, finish or call-off.
 * Only events after the last deleted log count (a deleted log starts the job afresh).
 *
 * @param events the job's log, any order; `at` as a Date
 * @example hoursWorked([{ type: 'start', at: t('08:00') }, { type: 'pause', at: t('10:00') }, { type: 'resume', at: t('10:30') }, { type: 'finish', at: t('12:00') }]) // 3.5
 */
export function hoursWorked(events: ReadonlyArray<{ type: string; at: Date }>): number {
  const sorted = [...events].sort((a, b) => a.at.getTime() - b.at.getTime());
  const reset = sorted.map((e) => e.type).lastIndexOf('log-deleted');
  let running: number | null = null;
  let ms = 0;
  for (const e of sorted.slice(reset + 1)) {
    if (e.type === 'start' || e.type === 'resume') running ??= e.at.getTime();
    else if ((e.type === 'pause' || e.type === 'finish' || e.type === 'call-off') && running !== null) {
      ms += e.at.getTime() - running;
      running = null;
    }
  }
  return roundTo(ms / 3_600_000, 2);
}

/**
 * Hours covered by a set of intervals, counting overlaps once (a mentor working beside the
 * learner is not working twice).
 *
 * @param intervals [start, end) in minutes
 * @example coveredHours([[420, 600], [540, 660]]) // 4
 */
export function coveredHours(intervals: ReadonlyArray<readonly [number, number]>): number {
  const sorted = [...intervals].sort((a, b) => a[0] - b[0]);
  let total = 0;
  let curStart = -Infinity;
  let curEnd = -Infinity;
  for (const [s, e] of sorted) {
    if (s > curEnd) {
      if (curEnd > curStart) total += curEnd - curStart;
      curStart = s;
      curEnd = e;
    } else curEnd = Math.max(curEnd, e);
  }
  if (curEnd > curStart) total += curEnd - curStart;
  return roundTo(total / 60, 2);
}

/**
 * Engine hours a finished job ran, in SQL over `assignments`: only where both meter readings are
 * there and run forwards (a reading that runs backwards is refused when logged, but a log may
 * lack one).
 */
export const ENGINE_HOURS_SQL = 'case when engine_hours_end >= engine_hours_start then engine_hours_end - engine_hours_start end';

/**
 * Engine hours a job ran: the meter at the finish less the meter at the start, the same rule as
 * `ENGINE_HOURS_SQL`; null when a reading is missing or runs backwards. The meter reads to a tenth
 * of an hour, so the difference is rounded to a tenth (2789.4 − 2781 is 8.4, not 8.3999…).
 *
 * @example engineHoursRun(2781, 2789.4) // 8.4
 */
export function engineHoursRun(start: number | null, end: number | null): number | null {
  return start != null && end != null && end >= start ? roundTo(end - start, 1) : null;
}
