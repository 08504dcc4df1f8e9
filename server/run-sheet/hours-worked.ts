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
  return Math.round((ms / 3_600_000) * 100) / 100;
}
