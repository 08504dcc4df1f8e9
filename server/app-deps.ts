import type { ComputePool } from './compute/pool';
import type { Config } from './config';
import type { Db } from './db/knex';

/** What the app needs from outside; tests build the same thing against the test database. */
export interface AppDeps {
  config: Config;
  db: Db;
  /** Worker threads for heavy computations (plans, boundary checks, file imports). */
  compute: ComputePool;
  /** Wakes the mail worker after a commit that queued e-mail. */
  nudgeMail: () => void;
  log?: (err: unknown) => void;
}
