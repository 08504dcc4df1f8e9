import { randomBytes } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import helmet from 'helmet';

/**
 * The scripts the browser may run as the app's service worker: Furlong's (Angular's worker with the
 * outbox's Background Sync), the Angular worker it imports, and its off switch.
 */
const SERVICE_WORKER_SCRIPTS = new Set(['/furlong-sw.js', '/ngsw-worker.js', '/safety-worker.js', '/worker-basic.min.js']);

export const nonceOf = (res: Response): string => res.locals.cspNonce as string;

/**
 * Security headers. Pages (index.html) get a strict content-security policy: nothing but the
 * app's own origin, and Angular adds its component styles with a per-request nonce given to
 * `ngCspNonce`. API answers are data, never pages: their policy allows nothing at all, and they
 * need no nonce (making one for each of them cost a noticeable share of a cached board request,
 * measured with `npm run bench -- server`).
 *
 * Every API answer is private to the signed-in person (or carries a fresh XSRF cookie), so none
 * may be kept by the browser's disk cache or a shared proxy: `Cache-Control: no-store` unless a
 * route sets its own. The work board still sends an ETag and answers 304 to a client that sends
 * `If-None-Match` (Express checks freshness against the request, whatever the answer's policy).
 *
 * The service worker's script gets a policy of its own: a worker is bound by the policy its
 * script came with, and it fetches on the page's behalf, so a map background (an image on the
 * page) is a fetch there and needs the tile origin under `connect-src`.
 */
export function securityHeaders(secure: boolean, tileUrl: string | null = null): RequestHandler {
  // A configured map background is the one other origin pages may load (images only).
  const tileOrigin = tileOrigins(tileUrl);
  const common = {
    strictTransportSecurity: secure ? { maxAge: 15552000 } : false,
    crossOriginEmbedderPolicy: false,
  } as const;
  const pageHeaders = helmet({
    ...common,
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'", (_req, res) => `'nonce-${nonceOf(res as Response)}'`],
        imgSrc: ["'self'", 'data:', 'blob:', ...tileOrigin],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        manifestSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(secure ? { upgradeInsecureRequests: [] } : {}),
      },
    },
  });
  const apiHeaders = helmet({
    ...common,
    contentSecurityPolicy: { useDefaults: false, directives: { defaultSrc: ["'none'"], frameAncestors: ["'none'"] } },
  });
  const workerHeaders = helmet({
    ...common,
    contentSecurityPolicy: {
      useDefaults: false,
      directives: { defaultSrc: ["'none'"], scriptSrc: ["'self'"], connectSrc: ["'self'", ...tileOrigin] },
    },
  });
  return (req, res, next) => {
    if (SERVICE_WORKER_SCRIPTS.has(req.path)) return workerHeaders(req, res, next);
    if (req.path.startsWith('/api/')) {
      res.set('Cache-Control', 'no-store');
      return apiHeaders(req, res, next);
    }
    res.locals.cspNonce = randomBytes(16).toString('base64');
    pageHeaders(req, res, next);
  };
}

/** The origin(s) of a tile URL template such as `https://{s}.tiles.example/{z}/{x}/{y}.png`. */
export function tileOrigins(tileUrl: string | null): string[] {
  if (!tileUrl) return [];
  const m = /^(https?):\/\/([^/]+)/.exec(tileUrl);
  if (!m) return [];
  const host = m[2].replace('{s}', '*');
  return [`${m[1]}://${host}`];
}
