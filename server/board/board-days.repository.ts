import type { BoardChange } from '../../shared/schemas/board';
import type { Tx } from '../db/knex';
import type { DbBoardDayRow } from './board.rows';

export const getDay = (db: Tx, farmId: number, day: string): Promise<DbBoardDayRow | undefined> =>
  db<DbBoardDayRow>('board_days').where({ farm_id: farmId, day }).first();

/** Locks a board day (made at version 0 when new), so saves to one day take turns. */
export async function lockDay(db: Tx, farmId: number, day: string): Promise<DbBoardDayRow> {
  await db.raw('insert into board_days (farm_id, day) values (?, ?) on conflict do nothing', [farmId, day]);
  return (await db<DbBoardDayRow>('board_days').where({ farm_id: farmId, day }).forUpdate().first())!;
}

/** Raises the day's version by one and records what changed; returns the new version. */
export async function bumpDay(
  db: Tx,
  farmId: number,
  day: string,
  change: { byUserId: number | null; summary: string; assignmentIds: number[] },
): Promise<number> {
  const [row] = await db('board_days').where({ farm_id: farmId, day }).increment('version', 1).returning('version');
  await db('board_changes').insert({
    farm_id: farmId,
    day,
    version: row.version,
    by_user_id: change.byUserId,
    summary: change.summary.slice(0, 500),
    assignment_ids: change.assignmentIds,
  });
  return row.version;
}

export async function markPublished(db: Tx, farmId: number, day: string): Promise<void> {
  await db('board_days').where({ farm_id: farmId, day }).update({ published_at: db.fn.now() });
}

export async function changesSince(db: Tx, farmId: number, day: string, version: number): Promise<BoardChange[]> {
  const rows = await db('board_changes as c')
    .leftJoin('users as u', 'u.id', 'c.by_user_id')
    .where({ 'c.farm_id': farmId, 'c.day': day })
    .andWhere('c.version', '>', version)
    .orderBy('c.version')
    .select('c.version', 'c.at', 'c.summary', 'c.assignment_ids', 'u.name');
  return rows.map((r) => ({
    version: r.version,
    at: (r.at as Date).toISOString(),
    by: r.name ?? 'Someone',
    summary: r.summary,
    assignmentIds: r.assignment_ids,
  }));
}
