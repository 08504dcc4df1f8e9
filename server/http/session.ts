import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import pg from 'pg';

export interface SessionStore {
  store: session.Store;
  close: () => Promise<void>;
}

/** Sessions live in PostgreSQL (table `session`), so a server restart keeps people signed in. */
export function createSessionStore(databaseUrl: string, prune = true): SessionStore {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 4 });
  const PgStore = connectPgSimple(session);
  const store = new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: prune ? 15 * 60 : false });
  return {
    store,
    close: async () => {
      (store as unknown as { close: () => void }).close();
      await pool.end();
    },
  };
}
