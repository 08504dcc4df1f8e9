import type { ComputePool } from './compute/pool';
import type { Config } from './config';
import type { Db } from './db/knex';
import type { Logger } from './logging/logger';
import type { PaymentService } from './payments/payments.client';

/** What the app needs from outside; tests build the same thing against the test database. */
export interface AppDeps {
  config: Config;
  db: Db;
  /** Worker threads for heavy computations (plans, boundary checks, file imports). */
  compute: ComputePool;
  /** The payment service (or its local fake), through its SDK. */
  payments: PaymentService;
  /** Wakes the mail worker after a commit that queued e-mail. */
  nudgeMail: () => void;
  /**
   * Also told of every failure the error handler logs, with the same object (tests capture it).
   * Failures go to the request's logger (`logger`) either way.
   */
  log?: (err: unknown) => void;
  /** Where request lines and failures are logged; defaults to `createLogger(config)`. */
  logger?: Logger;
}
