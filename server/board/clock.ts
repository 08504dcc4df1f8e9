/**
 * Minutes after midnight as 'HH:MM'; a day that runs past midnight keeps counting (25:30).
 *
 * @example formatMinutes(450) // '07:30'
 */
export function formatMinutes(min: number): string {
  const m = Math.round(min);
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
}

/**
 * 'HH:MM' as minutes after midnight.
 *
 * @example parseTime('07:30') // 450
 */
export function parseTime(hhmm: string): number {
  const [h, m] = hhmm.split(':').map(Number);
  return h * 60 + m;
}
