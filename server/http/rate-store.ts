import cluster from 'node:cluster';
import { ClusterMemoryStoreWorker } from '@express-rate-limit/cluster-memory-store';
import type { Store } from 'express-rate-limit';

/**
 * Where a rate limit counts. Under several server processes (server/index.ts), in the primary
 * process's memory, so each limit holds for all of them together; in one process, in its own
 * memory (express-rate-limit's default). `prefix` keeps each limit's counts apart.
 */
export const rateStore = (prefix: string): Store | undefined => (cluster.isWorker ? new ClusterMemoryStoreWorker({ prefix }) : undefined);
