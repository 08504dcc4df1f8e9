import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import { LRUCache } from 'lru-cache';
import pg from 'pg';
import { PRINCIPAL_SQL } from '../auth/users.repository';
import type { SessionPrincipal } from './session-user';

/** Sign-ins: the sessions, and who each signed-in session is, on a small pool of their own. */
export interface SessionStore {
  store: session.Store;
  /**
   * The principal of a stored sign-in, read afresh (every request asks). One named statement on
   * this pool rather than a knex query: measured with `npm run bench -- server`, knex's building
   * and running of this one query cost about as much as the rest of a cached board request.
   */
  principal: (userId: number, membershipId: number, signedInAt: Date) => Promise<SessionPrincipal | undefined>;
  close: () => Promise<void>;
}

/** How often a session's expiry is moved on while it is in use. */
export const TOUCH_INTERVAL_MS = 60_000;
/** How long a session read from PostgreSQL is reused for the same person's next requests. */
export const SESSION_REUSE_MS = 5_000;

/** How a lost or refused connection is reported: one line, no SQL and no values. */
const reportDbError = (what: string, err: unknown) => {
  const e = err as { code?: string; message?: string };
  console.error(`furlong: ${what}: ${e?.code ? `${e.code} ` : ''}${e?.message ?? String(err)}`);
};

/** Sessions live in PostgreSQL (table `session`), so a server restart keeps people signed in. */
export function createSessionStore(
  databaseUrl: string,
  prune = true,
  onError: (what: string, err: unknown) => void = reportDbError,
): SessionStore {
  // A connection waits at most 5 s for PostgreSQL, so requests during an outage fail quickly (503).
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 4, connectionTimeoutMillis: 5000 });
  // An idle client whose server goes away (PostgreSQL restarted: 57P01) is reported on the pool;
  // without a listener that report is an unhandled 'error' event and ends the process. The pool
  // has already dropped the client; the next query opens a new connection.
  pool.on('error', (err) => onError('a sessions database connection was lost', err));
  let n = 0;
  const principalSql = PRINCIPAL_SQL.replace(/\?/g, () => `$${++n}`);
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: prune ? 15 * 60 : false,
    // Pruning during an outage fails and is tried again at the next interval.
    errorLog: (what: string, err: unknown) => onError(String(what).replace(/:$/, '').toLowerCase(), err),
  });
  throttleTouch(store);
  const changes = new SessionChanges(databaseUrl, onError);
  reuseReads(store, changes);
  let closing: Promise<void> | undefined;
  return {
    store,
    principal: async (userId, membershipId, signedInAt) => {
      const { rows } = await pool.query<SessionPrincipal>({
        name: 'session-principal',
        text: principalSql,
        values: [membershipId, userId, signedInAt],
      });
      return rows[0];
    },
    // Safe to call twice (a second SIGINT/SIGTERM during shutdown): pg refuses a second end().
    close: async () => {
      closing ??= (async () => {
        await changes.close();
        await (store as unknown as { close: () => Promise<void> }).close();
        await pool.end();
      })();
      return closing;
    },
  };
}

/**
 * A rolling session is "touched" (its expiry moved on) after every request. Doing that once a
 * minute per session is enough for a 30-day expiry, and spares PostgreSQL an UPDATE of the same
 * row for each of the many requests one page makes at once.
 */
function throttleTouch(store: session.Store): void {
  const touch = store.touch!.bind(store);
  const recent = new LRUCache<string, true>({ max: 10_000, ttl: TOUCH_INTERVAL_MS });
  // express-session passes an error to the callback, though its types say it takes none.
  store.touch = (sid, sess, done?: (err?: unknown) => void) => {
    if (recent.has(sid)) return done?.();
    recent.set(sid, true);
    touch(sid, sess, ((err?: unknown) => {
      if (err) recent.delete(sid);
      done?.(err);
    }) as () => void);
  };
}

/**
 * Listens on PostgreSQL's `furlong_session` channel, where a trigger names every session that
 * is signed out or changed (migrations/20261202000600_session_change_notify.ts), in whichever
 * server process it happened. While the listening connection is down, nothing is kept: a
 * notification could be missed, so every read goes to the database until it is back.
 */
class SessionChanges {
  private client: pg.Client | null = null;
  private closed = false;
  private retry: NodeJS.Timeout | null = null;
  /** Called with a session id, or with nothing when every kept copy must go. */
  onChange: (sid?: string) => void = () => undefined;
  listening = false;

  constructor(
    private readonly databaseUrl: string,
    private readonly onError: (what: string, err: unknown) => void,
  ) {
    void this.connect();
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({ connectionString: this.databaseUrl, connectionTimeoutMillis: 5000 });
    this.client = client;
    const lost = (err?: unknown) => {
      if (this.client !== client) return;
      this.client = null;
      this.listening = false;
      this.onChange();
      client.removeAllListeners('notification');
      void client.end().catch(() => undefined);
      if (this.closed) return;
      if (err) this.onError('the session change listener lost its connection', err);
      this.retry = setTimeout(() => void this.connect(), 1000);
      this.retry.unref();
    };
    client.on('error', lost);
    client.on('end', () => lost());
    client.on('notification', (n) => this.onChange(n.payload));
    try {
      await client.connect();
      await client.query('LISTEN furlong_session');
      if (this.client === client) this.listening = true;
    } catch (err) {
      lost(err);
    }
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.retry) clearTimeout(this.retry);
    const client = this.client;
    this.client = null;
    this.listening = false;
    await client?.end().catch(() => undefined);
  }
}

/**
 * One page asks for several things at once, each with the same session cookie: the session read
 * from PostgreSQL is kept for a few seconds and reused. Saving or destroying a session (signing
 * in or out) in this process drops the kept copy at once, and in every other process as soon as
 * PostgreSQL's notification arrives (`SessionChanges`). Who the person is and what they may do
 * is still read afresh on every request (`principal`).
 */
function reuseReads(store: session.Store, changes: SessionChanges): void {
  const { get, set, destroy } = { get: store.get.bind(store), set: store.set.bind(store), destroy: store.destroy.bind(store) };
  const kept = new LRUCache<string, string>({ max: 10_000, ttl: SESSION_REUSE_MS });
  // A change that arrives while a read is under way may be older than what the read returns, or
  // newer: the read is then used once and not kept.
  let changeCount = 0;
  changes.onChange = (sid) => {
    changeCount++;
    if (sid) kept.delete(sid);
    else kept.clear();
  };
  store.get = (sid, done) => {
    const json = kept.get(sid);
    if (json) {
      const sess = JSON.parse(json) as session.SessionData;
      const expires = sess.cookie?.expires ? new Date(sess.cookie.expires).getTime() : Infinity;
      if (expires > Date.now()) return done(null, sess);
      kept.delete(sid);
    }
    const before = changeCount;
    get(sid, (err: unknown, sess?: session.SessionData | null) => {
      if (!err && sess && changes.listening && changeCount === before) kept.set(sid, JSON.stringify(sess));
      done(err, sess);
    });
  };
  store.set = (sid, sess, done) => {
    kept.delete(sid);
    set(sid, sess, done);
  };
  store.destroy = (sid, done) => {
    kept.delete(sid);
    destroy(sid, done);
  };
}
