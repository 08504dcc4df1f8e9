import fs from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import session from 'express-session';
import type { AppDeps } from './app-deps';
import { trackCoverageRoutes } from './track-coverage/coverage.routes';
import { phoneTrackRoutes } from './phone-track/phone-track.routes';
import { authRoutes } from './auth/auth.routes';
import { backgroundRoutes } from './background/background.routes';
import { sharedComputePool, type ComputePool } from './compute/pool';
import { createPassport, restorePrincipal } from './auth/passport';
import { healthRoutes } from './health/health.routes';
import { csrfProtection } from './http/csrf';
import type { SessionStore } from './http/session';
import { AppError, apiNotFound, errorHandler } from './http/errors';
import { Routes, type RouteEntry } from './http/routes';
import { nonceOf, securityHeaders } from './http/security';
import { createLogger } from './logging/logger';
import { requestLogger } from './logging/request-log';
import { farmRoutes } from './farm/farm.routes';
import { cropPlanRoutes, fieldRoutes } from './fields/fields.routes';
import { memberRoutes } from './members/members.routes';
import { planRoutes } from './plans/plans.routes';
import { assignmentRoutes, boardRoutes } from './board/board.routes';
import { boardTaskDataRoutes, jobTaskDataRoutes } from './taskdata/taskdata.routes';
import { crewRoutes } from './crew/crew.routes';
import { fleetRoutes } from './fleet/fleet.routes';
import { jobLogRoutes, runSheetRoutes } from './run-sheet/run-sheet.routes';
import { reportRoutes } from './reports/reports.routes';
import { seasonRoutes } from './season/season.routes';
import { openapiRoutes } from './openapi/openapi.routes';
import { weatherRoutes } from './weather/weather.routes';
import { createPaymentService, type PaymentService } from './payments/payments.client';
import { paymentWebhookRoutes } from './payments/payments.routes';
import { costRoutes } from './costs/costs.routes';
import { customerRoutes, fieldCustomerRoutes } from './customers/customers.routes';
import { rateCardRoutes } from './rate-card/rate-card.routes';
import { invoiceRoutes } from './invoices/invoices.routes';
import { projectRoot } from './paths';

export interface CreateAppOptions extends Omit<AppDeps, 'compute' | 'payments'> {
  /** Defaults to the service (or the local fake) the configuration names. */
  payments?: PaymentService;
  /** Defaults to the process's shared compute pool. */
  compute?: ComputePool;
  sessions: SessionStore;
  /** The built Angular app; defaults to dist/furlong/browser. */
  staticDir?: string;
}

/** Builds the Express app (API + the built Angular app). Never listens: index.ts does. */
export function createApp(options: CreateAppOptions): Express {
  const deps: CreateAppOptions & AppDeps = {
    ...options,
    compute: options.compute ?? sharedComputePool({ timeLimitMs: options.config.computeTimeLimitMs }),
    payments: options.payments ?? createPaymentService(options.config),
  };
  const { config } = deps;
  const app = express();
  const routes: RouteEntry[] = [];
  app.locals.routes = routes;
  app.disable('x-powered-by');
  // First, so every answer (also a refused or failed one) has its X-Request-Id and its log line.
  app.use(requestLogger(deps.logger ?? createLogger(config)));
  if (config.trustProxy) app.set('trust proxy', 1);
  app.use(securityHeaders(config.secureCookies, config.mapTileUrl));

  // The payment service's webhook reads its body raw (its signature covers the exact bytes) and
  // carries no session or CSRF token: the signature is its authentication. So it comes first.
  const hooks = new Routes('/api/payments', routes);
  paymentWebhookRoutes(hooks, deps);
  app.use('/api/payments', hooks.router);

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(cookieParser());
  api.use(
    session({
      name: 'furlong.sid',
      secret: config.sessionSecret,
      store: deps.sessions.store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: 30 * 86_400_000, path: '/' },
    }),
  );
  const passport = createPassport(deps);
  api.use(restorePrincipal(deps.sessions));
  api.use(csrfProtection(config.sessionSecret, config.secureCookies));

  const mount = (prefix: string, build: (r: Routes) => void) => {
    const r = new Routes(`/api${prefix}`, routes);
    build(r);
    api.use(prefix, r.router);
  };
  mount('', (r) => healthRoutes(r, deps));
  mount('/auth', (r) => authRoutes(r, deps, passport));
  mount('/members', (r) => memberRoutes(r, deps));
  mount('/background', (r) => backgroundRoutes(r, deps));
  mount('/farm', (r) => farmRoutes(r, deps));
  mount('/fields', (r) => fieldRoutes(r, deps));
  mount('/crop-plans', (r) => cropPlanRoutes(r, deps));
  mount('/plans', (r) => planRoutes(r, deps));
  mount('/fleet', (r) => fleetRoutes(r, deps));
  mount('/crew', (r) => crewRoutes(r, deps));
  mount('/board', (r) => boardRoutes(r, deps));
  mount('/board', (r) => boardTaskDataRoutes(r, deps));
  mount('/assignments', (r) => assignmentRoutes(r, deps));
  mount('/assignments', (r) => jobLogRoutes(r, deps));
  mount('/assignments', (r) => jobTaskDataRoutes(r, deps));
  mount('/assignments', (r) => trackCoverageRoutes(r, deps));
  mount('/assignments', (r) => phoneTrackRoutes(r, deps));
  mount('/run-sheet', (r) => runSheetRoutes(r, deps));
  mount('/reports', (r) => reportRoutes(r, deps));
  mount('/season', (r) => seasonRoutes(r, deps));
  mount('/weather', (r) => weatherRoutes(r, deps));
  mount('/costs', (r) => costRoutes(r, deps));
  mount('/customers', (r) => customerRoutes(r, deps));
  mount('/fields', (r) => fieldCustomerRoutes(r, deps));
  mount('/rate-card', (r) => rateCardRoutes(r, deps));
  mount('/invoices', (r) => invoiceRoutes(r, deps));
  mount('', (r) => openapiRoutes(r, deps));
  api.use(apiNotFound);
  app.use('/api', api);

  serveApp(app, deps.staticDir ?? path.join(projectRoot, 'dist', 'furlong', 'browser'));
  app.use(errorHandler(deps.log));
  return app;
}

/** The service worker's own files: each start of the app asks for them anew, so a new version is found. */
const SERVICE_WORKER_FILES = new Set(['furlong-sw.js', 'ngsw-worker.js', 'ngsw.json', 'safety-worker.js', 'worker-basic.min.js']);

/**
 * Serves the built app; every other path gets index.html with this request's CSP nonce.
 *
 * `/index.html` itself gets a nonce too: the service worker (ngsw-config.json) keeps its last copy
 * of the page, with the CSP header it came with, to open the app with no network. Its nonce was
 * made for one request of this device and is in no shared file (a copy made at build time would
 * carry the same placeholder for everyone); offline starts on that device reuse it.
 */
function serveApp(app: Express, dir: string): void {
  const indexFile = path.join(dir, 'index.html');
  const index = fs.existsSync(indexFile) ? fs.readFileSync(indexFile, 'utf8') : null;
  const sendIndex: express.RequestHandler = (_req, res) => {
    if (!index) throw new AppError(503, 'not_built', 'The app is not built yet: run npm start');
    res
      .set('Cache-Control', 'no-cache')
      .type('html')
      .send(index.replaceAll('CSP_NONCE', nonceOf(res)));
  };
  app.get('/index.html', sendIndex);
  app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: noCacheForIndex }));
  app.get('/{*splat}', sendIndex);
}

function noCacheForIndex(res: express.Response, file: string): void {
  if (file.endsWith('.html') || SERVICE_WORKER_FILES.has(path.basename(file))) res.set('Cache-Control', 'no-cache');
}
