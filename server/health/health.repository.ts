import type { Tx } from '../db/knex';

/** Answers when the database does, within `timeoutMs`; throws otherwise. */
export async function pingDatabase(db: Tx, timeoutMs: number): Promise<void> {
  await db.raw('select 1').timeout(timeoutMs);
}
