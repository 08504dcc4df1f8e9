import type { OrderStatus } from '../../shared/schemas/board';
import type { Tx } from '../db/knex';
import type { DbWorkOrderRow } from './board.rows';

export interface WorkOrderWithMail extends DbWorkOrderRow {
  mail_status: Exclude<OrderStatus, 'none'> | null;
  sent_at: Date | null;
}

/** The orders last published for a day, with their delivery state from the outbox. */
export const ordersOfDay = (db: Tx, farmId: number, day: string): Promise<WorkOrderWithMail[]> =>
  db('work_orders as w')
    .leftJoin('mail_outbox as o', 'o.id', 'w.mail_id')
    .where({ 'w.farm_id': farmId, 'w.day': day })
    .select('w.*', 'o.status as mail_status', 'o.sent_at');

export async function saveOrder(db: Tx, row: Omit<DbWorkOrderRow, 'published_at'>): Promise<void> {
  // jsonb from an array must be sent as JSON text: the driver would send a PostgreSQL array.
  const jobs = row.jobs && JSON.stringify(row.jobs);
  await db('work_orders')
    .insert({ ...row, jobs })
    .onConflict(['farm_id', 'day', 'membership_id'])
    .merge({
      kind: row.kind,
      content_hash: row.content_hash,
      jobs,
      mail_id: row.mail_id,
      board_version: row.board_version,
      published_at: db.fn.now(),
    });
}
