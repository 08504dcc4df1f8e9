import { DAY_START_MIN } from '../../shared/schemas/board';

export interface ScheduleCard {
  id: number;
  operatorId: number;
  order: number;
  startMin: number | null;
  endMin: number | null;
  planHours: number;
}

export interface CardSpan {
  /** Minutes after midnight; `end` may pass 24:00 (a day that runs past midnight keeps counting). */
  start: number;
  end: number;
  /** The window the owner set (an end time, with or without a start), or null when none was. */
  window: { start: number; end: number } | null;
  /** The work fits in the window (always, without one). */
  fits: boolean;
}

/**
 * The one rule for a card's time and hours: from its start, a card holds its people for the
 * longer of its planned hours and the window the owner set. A window longer than the work books
 * them for the whole window (the owner chose it); a window shorter than the work does not make
 * the work shorter: the card runs on past the window's end and `fits` is false, so the board,
 * the column's hours, the day limit and the work order all count the same hours.
 *
 * @param cursor where the card starts when the owner set no start (the end of the previous card)
 * @example cardSpan({ startMin: 480, endMin: 720, planHours: 28.5 }, 420) // { start: 480, end: 2190, window: { start: 480, end: 720 }, fits: false }
 */
export function cardSpan(c: Pick<ScheduleCard, 'startMin' | 'endMin' | 'planHours'>, cursor: number): CardSpan {
  const length = Math.max(1, Math.round(c.planHours * 60));
  // With only an end, the card starts early enough to finish by it (not before midnight).
  const start = c.startMin ?? (c.endMin != null ? Math.max(0, Math.min(cursor, c.endMin - length)) : cursor);
  const window = c.endMin != null ? { start, end: c.endMin } : null;
  const fits = !window || window.end - window.start >= length;
  return { start, end: Math.max(window?.end ?? 0, start + length), window, fits };
}

/**
 * Effective start and end of each card, minutes after midnight (see `cardSpan`). An operator's
 * cards without times run back-to-back from 07:00 in running order, so overlaps can be found even
 * on a board without times.
 */
export function schedule(cards: readonly ScheduleCard[]): Map<number, CardSpan> {
  const out = new Map<number, CardSpan>();
  const byOperator = new Map<number, ScheduleCard[]>();
  for (const c of cards) byOperator.set(c.operatorId, [...(byOperator.get(c.operatorId) ?? []), c]);
  for (const column of byOperator.values()) {
    column.sort((a, b) => a.order - b.order || a.id - b.id);
    let cursor = DAY_START_MIN;
    for (const c of column) {
      const span = cardSpan(c, cursor);
      out.set(c.id, span);
      cursor = span.end;
    }
  }
  return out;
}
