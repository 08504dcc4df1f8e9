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
  return Math.round((total / 60) * 100) / 100;
}
