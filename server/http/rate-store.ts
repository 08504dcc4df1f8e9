import cluster from 'node:cluster';
import { ClusterMemoryStoreWorker } from '@express-rate-limit/cluster-memory-store';
import type { Store } from 'express-rate-limit';

/**
 * Where a rate limit counts. Under several server processes (server/index.ts), in the primary
 * process's memory, so each limit holds for all of them together; in one process, in its own
 * memory (express-rate-limit's default). `prefix` keeps each limit's counts apart.
 *
 * Each such store listens for the primary's answers on this process's link to it (one 'message'
 * listener on `cluster.worker` per limit, added once as the routes are built), and a store cannot
 * serve two limits. Node warns of a leak past 10 listeners on one emitter: the link's threshold is
 * raised by one for each store made here, so the warning still fires for any listener beyond them.
 */
export function rateStore(prefix: string): Store | undefined {
  const link = cluster.worker;
  if (!cluster.isWorker || !link) return undefined;
  link.setMaxListeners(link.getMaxListeners() + 1);
  return new ClusterMemoryStoreWorker({ prefix });
}
