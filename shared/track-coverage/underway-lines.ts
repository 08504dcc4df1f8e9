import type { TrackPoint } from './coverage';

/** A logged step of a job, as the coverage of its phone track needs it. */
export interface JobStep {
  type: string;
  /** When it was tapped, ms since 1970. */
  at: number;
}

/**
 * The spans of time a job was underway, from its log in tap order: from a start or a resume to
 * the next pause, finish or call-off (a job still underway: to no end).
 *
 * @example underwaySpans([{ type: 'start', at: 0 }, { type: 'pause', at: 10 }]) // [[0, 10]]
 */
export function underwaySpans(steps: readonly JobStep[]): Array<[number, number]> {
  const spans: Array<[number, number]> = [];
  let open: number | null = null;
  for (const s of [...steps].sort((a, b) => a.at - b.at)) {
    if (s.type === 'start' || s.type === 'resume') open ??= s.at;
    else if ((s.type === 'pause' || s.type === 'finish' || s.type === 'call-off') && open !== null) {
      spans.push([open, s.at]);
      open = null;
    }
  }
  if (open !== null) spans.push([open, Infinity]);
  return spans;
}

/**
 * A phone track as lines for the coverage computation: the points taken while the job was
 * underway, in time order, one line per span (a pause breaks the line, so no swath is drawn across
 * the ground between where the tractor stopped and where it went on). The phone knows nothing of
 * the implement's work state: every point while underway counts as working. Lines of fewer than
 * two points are left out.
 *
 * @param points positions with `t`, ms since 1970
 * @param steps the job's logged steps
 */
export function linesWhileUnderway(points: readonly TrackPoint[], steps: readonly JobStep[]): TrackPoint[][] {
  const sorted = points.filter((p) => p.t !== undefined).sort((a, b) => a.t! - b.t!);
  return underwaySpans(steps)
    .map(([from, to]) => sorted.filter((p) => p.t! >= from && p.t! <= to).map((p) => ({ lon: p.lon, lat: p.lat, t: p.t, working: true })))
    .filter((l) => l.length >= 2);
}
