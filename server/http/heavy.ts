import type { Request, RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { AppError } from './errors';
import { rateStore } from './rate-store';

let guards = 0;

/** Heavy requests one person may have running at once (a second tab, a double click). */
const MAX_RUNNING_PER_PERSON = 2;

/**
 * Guards a route that starts heavy work (a plan, a boundary check, a file import): a per-person
 * rate limit, and at most two such requests of one person running at a time, so one member cannot
 * keep the compute workers busy for everybody else. The rate limit counts across server
 * processes; the running count is per process, as each process has its own compute workers.
 *
 * @param perMinute requests one person may start per minute on this route
 */
export function heavyWork(perMinute: number): RequestHandler[] {
  // Routes are built in the same order in every server process, so the n-th guard counts as one.
  const name = `heavy-${++guards}`;
  const running = new Map<number, number>();
  const personKey = (req: Request) => `person:${req.user?.id ?? 0}`;
  const limiter = rateLimit({
    store: rateStore(name),
    windowMs: 60_000,
    limit: perMinute,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: personKey,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate_limited', `You started more than ${perMinute} of these in a minute; wait a minute and try again`)),
  });
  const oneAtATime: RequestHandler = (req, res, next) => {
    const id = req.user?.id ?? 0;
    const now = running.get(id) ?? 0;
    if (now >= MAX_RUNNING_PER_PERSON)
      throw new AppError(429, 'busy_for_you', 'Your earlier request is still being worked out; wait for it to finish');
    running.set(id, now + 1);
    res.once('close', () => {
      const left = (running.get(id) ?? 1) - 1;
      if (left <= 0) running.delete(id);
      else running.set(id, left);
    });
    next();
  };
  return [limiter, oneAtATime];
}
