import type { Board, BoardWeather } from '../../shared/schemas/board';
import type { Tx } from '../db/knex';
import { findConflicts, hoursByPerson } from './conflicts';
import { loadDay, type DayContext } from './day-context';
import { loadDayWeather, NO_WEATHER } from './day-weather';
import { nextDayWithWork } from './day.repository';
import { planOrders, toOrderState } from './work-order.state';
import { ordersOfDay, type WorkOrderWithMail } from './work-orders.repository';

/** The board as the owner sees it: cards, conflicts, every operator's planned hours and order state. */
export function boardOf(
  ctx: DayContext,
  published: WorkOrderWithMail[],
  publicUrl: string,
  weather: BoardWeather = NO_WEATHER,
  nextDay: string | null = null,
): Board {
  const hours = hoursByPerson(ctx.cards);
  const onBoard = new Set(ctx.cards.map((c) => c.a.operator.membershipId));
  const operators = ctx.people
    .filter((p) => (p.status === 'active' && p.role !== 'viewer') || onBoard.has(p.membership_id))
    .map((p) => ({ membershipId: p.membership_id, name: p.name, plannedHours: hours.get(p.membership_id)?.hours ?? 0 }));
  return {
    date: ctx.day,
    version: ctx.boardDay?.version ?? 0,
    publishedAt: ctx.boardDay?.published_at?.toISOString() ?? null,
    dayHoursLimit: ctx.farm.dayHoursLimit,
    assignments: ctx.cards.map((c) => c.a),
    conflicts: findConflicts(ctx.cards, ctx.skills, ctx.farm.dayHoursLimit, weather.cards),
    operators,
    orders: planOrders(ctx, published, publicUrl).map(toOrderState),
    weather,
    nextDayWithWork: nextDay,
  };
}

export interface ReadBoardOptions {
  /** Told when the day's weather could not be read (the board answers without it). */
  onWeatherError?: (err: unknown) => void;
  now?: Date;
}

export async function readBoard(db: Tx, farmId: number, day: string, publicUrl: string, options: ReadBoardOptions = {}): Promise<Board> {
  const ctx = await loadDay(db, farmId, day);
  const orders = await ordersOfDay(db, farmId, day);
  const weather = await loadDayWeather(db, ctx, { now: options.now, onError: options.onWeatherError });
  return boardOf(ctx, orders, publicUrl, weather, await nextDayWithWork(db, farmId, day));
}
