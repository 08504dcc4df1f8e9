import { DAY_START_MIN } from '../../shared/schemas/board';

export interface ScheduleCard {
  id: number;
  operatorId: number;
  order: number;
  startMin: number | null;
  endMin: number | null;
  planHours: number;
}

/**
 * Effective start and end of each card, minutes after midnight. Times the owner set are kept;
 * otherwise an operator's cards run back-to-back from 07:00 in running order, each taking its
 * plan hours, so overlaps can be found even on a board without times.
 */
export function schedule(cards: readonly ScheduleCard[]): Map<number, { start: number; end: number }> {
  const out = new Map<number, { start: number; end: number }>();
  const byOperator = new Map<number, ScheduleCard[]>();
  for (const c of cards) byOperator.set(c.operatorId, [...(byOperator.get(c.operatorId) ?? []), c]);
  for (const column of byOperator.values()) {
    column.sort((a, b) => a.order - b.order || a.id - b.id);
    let cursor = DAY_START_MIN;
    for (const c of column) {
      const length = Math.max(1, Math.round(c.planHours * 60));
      let start = c.startMin ?? cursor;
      const end = c.endMin ?? start + length;
      if (c.startMin == null && end <= start) start = Math.max(0, end - length);
      out.set(c.id, { start, end });
      cursor = end;
    }
  }
  return out;
}
