import { randomUUID } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { roundTo } from '../../shared/round';
import type { Logger } from './logger';

declare module 'http' {
  interface IncomingMessage {
    /** This request's id (see `requestIdFor`), set by `requestLogger`. */
    id?: string;
    /** A logger whose lines carry this request's id, set by `requestLogger` (the error handler's lines). */
    log?: Logger;
  }
}

/** An incoming request id is kept only when it is a plain token a log reader can search for. */
const SANE_REQUEST_ID = /^[A-Za-z0-9._-]{1,100}$/;

/** The id of this request: the caller's `X-Request-Id` when it is sane, otherwise a new UUID. */
export function requestIdFor(given: string | string[] | undefined): string {
  return typeof given === 'string' && SANE_REQUEST_ID.test(given) ? given : randomUUID();
}

/**
 * The route pattern that answered (`/api/fields/:id`), never the concrete URL: a URL can carry a
 * query string with a token in it, and patterns group well. `Routes` sets `routePattern` for every
 * API route; other routes (the app's static files and index page) have Express's own `req.route`.
 * A request nothing matched has no pattern.
 */
function routeOf(req: Request, res: Response): string | undefined {
  const pattern = res.locals?.routePattern as string | undefined;
  if (pattern) return pattern;
  const path = (req.route as { path?: unknown } | undefined)?.path;
  return typeof path === 'string' ? `${req.baseUrl ?? ''}${path}` : undefined;
}

/**
 * One log line per request: requestId, method, route pattern, status, responseTime (ms), userId
 * and farmId (once `restorePrincipal` ran). No headers, no URL, no body: nothing with a cookie, a
 * token, a password or a person's data. The request id goes back as `X-Request-Id` on every answer
 * and is `req.id` for the error body; `req.log` carries it for anything logged while the request
 * runs (the error handler's lines).
 *
 * Written by hand rather than with pino-http: that makes three or four child loggers per request,
 * one of them serialising the whole request (headers included, then redacted) only to be dropped,
 * which cost about a fifth of the work board's throughput. Here a request costs one object and one
 * `logger.info` when it ends; the child logger behind `req.log` is made only when something asks
 * for it.
 */
export function requestLogger(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const started = performance.now();
    const id = requestIdFor(req.headers['x-request-id']);
    req.id = id;
    res.setHeader('X-Request-Id', id);
    let child: Logger | undefined;
    Object.defineProperty(req, 'log', {
      configurable: true,
      enumerable: false,
      get: () => (child ??= logger.child({ requestId: id })),
      set: (l: Logger) => (child = l),
    });
    // 'close' comes once the answer is sent, and also when the client goes away before it is.
    res.once('close', () => {
      const failed = res.statusCode >= 500;
      if (!logger.isLevelEnabled(failed ? 'error' : 'info')) return;
      const route = routeOf(req, res);
      const line = {
        requestId: id,
        method: req.method,
        route,
        status: res.statusCode,
        responseTime: roundTo(performance.now() - started, 1),
        userId: req.user?.id,
        farmId: req.user?.farmId,
      };
      const text = `${req.method} ${route ?? '(no route)'} ${res.statusCode}${res.writableEnded ? '' : ' (aborted)'}`;
      if (failed) logger.error(line, text);
      else logger.info(line, text);
    });
    next();
  };
}
