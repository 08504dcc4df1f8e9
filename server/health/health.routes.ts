import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { pingDatabase } from './health.repository';

export function healthRoutes(r: Routes, deps: AppDeps): void {
  r.get('/health', 'public', async (_req, res) => {
    try {
      await pingDatabase(deps.db, 2000);
      res.json({ status: 'ok', db: 'ok' });
    } catch {
      res.status(503).json({ status: 'degraded', db: 'down' });
    }
  });

  /** Settings the app needs before sign-in (the map's optional tile layer). */
  r.get('/config', 'public', (_req, res) => {
    res.json({ mapTileUrl: deps.config.mapTileUrl, mapTileAttribution: deps.config.mapTileAttribution });
  });
}
