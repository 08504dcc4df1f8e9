import { Router, type RequestHandler } from 'express';
import type { Role } from '../../shared/schemas/auth';
import { AppError, forbidden } from './errors';

/** Who may call a route: anyone, any signed-in member of the farm, or the listed roles. */
export type Access = 'public' | 'member' | readonly Role[];
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteEntry {
  method: Method;
  path: string;
  access: Access;
}

export const requireAccess =
  (access: Access): RequestHandler =>
  (req, _res, next) => {
    if (access === 'public') return next();
    if (!req.user) throw new AppError(401, 'signed_out', 'Sign in to continue');
    if (access !== 'member' && !access.includes(req.user.role)) throw forbidden();
    next();
  };

/**
 * A router that records every route with its access rule, so the authorization matrix test
 * can check that no route is left out and the server decides access for each one.
 */
export class Routes {
  readonly router = Router();

  constructor(
    private readonly prefix: string,
    private readonly registry: RouteEntry[],
  ) {}

  private add(method: Method, path: string, access: Access, handlers: RequestHandler[]): this {
    this.registry.push({ method, path: this.prefix + path, access });
    // The request log names the route's pattern (/api/fields/:id), never the URL it was called with.
    const pattern = this.prefix + path;
    const named: RequestHandler = (_req, res, next) => {
      res.locals.routePattern = pattern;
      next();
    };
    this.router[method](path, named, requireAccess(access), ...handlers);
    return this;
  }

  get = (path: string, access: Access, ...h: RequestHandler[]) => this.add('get', path, access, h);
  post = (path: string, access: Access, ...h: RequestHandler[]) => this.add('post', path, access, h);
  put = (path: string, access: Access, ...h: RequestHandler[]) => this.add('put', path, access, h);
  patch = (path: string, access: Access, ...h: RequestHandler[]) => this.add('patch', path, access, h);
  delete = (path: string, access: Access, ...h: RequestHandler[]) => this.add('delete', path, access, h);
}
