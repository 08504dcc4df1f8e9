import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { Request, RequestHandler, Response } from 'express';
import { pinoHttp } from 'pino-http';
import type { Logger } from './logger';

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

/** What a finished request adds to its line; the principal is there once `restorePrincipal` ran. */
function requestFields(req: Request, res: Response): Record<string, unknown> {
  return {
    method: req.method,
    route: routeOf(req, res),
    userId: req.user?.id,
    farmId: req.user?.farmId,
  };
}

/**
 * One log line per request (pino-http): requestId, method, route pattern, status, responseTime
 * (ms), userId and farmId. No headers, no URL, no body: nothing with a cookie, a token, a password
 * or a person's data. The request id goes back as `X-Request-Id` on every answer; `req.log` carries
 * it for anything logged while the request runs (the error handler's lines).
 */
export function requestLogger(logger: Logger): RequestHandler {
  const http = pinoHttp<IncomingMessage, ServerResponse>({
    logger,
    genReqId: (req, res) => {
      const id = requestIdFor(req.headers['x-request-id']);
      res.setHeader('X-Request-Id', id);
      return id;
    },
    // req.log holds only the id; the finished line is built below from what the request became.
    quietReqLogger: true,
    quietResLogger: true,
    customAttributeKeys: { reqId: 'requestId' },
    customProps: (req, res) => requestFields(req as Request, res as Response),
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
    customSuccessObject: (_req, res, val: { responseTime: number }) => ({ status: res.statusCode, responseTime: val.responseTime }),
    // The failure itself is logged by the error handler (without SQL or values); pino-http's own
    // error object would only say "failed with status code 500".
    customErrorObject: (_req, res, _err, val: { responseTime: number }) => ({ status: res.statusCode, responseTime: val.responseTime }),
    customSuccessMessage: (req, res) => lineText(req as Request, res as Response),
    customErrorMessage: (req, res) => lineText(req as Request, res as Response),
  });
  return http as unknown as RequestHandler;
}

const lineText = (req: Request, res: Response): string =>
  `${req.method} ${routeOf(req, res) ?? '(no route)'} ${res.statusCode}${res.writableEnded ? '' : ' (aborted)'}`;
