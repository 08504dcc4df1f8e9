import { randomBytes } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import helmet from 'helmet';

export const nonceOf = (res: Response): string => res.locals.cspNonce as string;

/**
 * A strict content-security policy: nothing but the app's own origin. Angular adds its
 * component styles with the per-request nonce given to `ngCspNonce` in index.html.
 */
export function securityHeaders(secure: boolean, tileUrl: string | null = null): RequestHandler[] {
  // A configured map background is the one other origin pages may load (images only).
  const tileOrigin = tileOrigins(tileUrl);
  const nonce: RequestHandler = (_req, res, next) => {
    res.locals.cspNonce = randomBytes(16).toString('base64');
    next();
  };
  const headers = helmet({
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
    strictTransportSecurity: secure ? { maxAge: 15552000 } : false,
    crossOriginEmbedderPolicy: false,
  });
  return [nonce, headers];
}

/** The origin(s) of a tile URL template such as `https://{s}.tiles.example/{z}/{x}/{y}.png`. */
export function tileOrigins(tileUrl: string | null): string[] {
  if (!tileUrl) return [];
  const m = /^(https?):\/\/([^/]+)/.exec(tileUrl);
  if (!m) return [];
  const host = m[2].replace('{s}', '*');
  return [`${m[1]}://${host}`];
}
