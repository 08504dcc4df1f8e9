import { isSeasonTable, SEASON_TABLES, seasonExportParams, seasonParams } from '../../shared/schemas/season';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { params } from '../http/validate';
import { seasonCsv } from './season.csv';
import { seasonIndex, seasonSummary } from './season.service';

/** Who reads the season: the owner (every report) and viewers (partners, landlord, accountant). */
const READERS = ['owner', 'viewer'] as const;

export function seasonRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', READERS, async (req, res) => {
    const by = principal(req);
    res.json(await seasonIndex(deps, by.farmId, by.timeZone));
  });

  r.get('/:year/summary', READERS, async (req, res) => {
    res.json(await seasonSummary(deps, principal(req).farmId, params(req, seasonParams).year));
  });

  r.get('/:year/export/:table.csv', READERS, async (req, res) => {
    const { year, table } = params(req, seasonExportParams);
    if (!isSeasonTable(table))
      throw new AppError(404, 'not_found', `There is no season table called “${table}”; choose one of: ${SEASON_TABLES.join(', ')}`);
    const me = principal(req);
    const csv = seasonCsv(await seasonSummary(deps, me.farmId, year), table, me.units);
    res
      .set('Content-Disposition', `attachment; filename="furlong-${year}-${table}.csv"`)
      .set('Cache-Control', 'no-store')
      .type('text/csv; charset=utf-8')
      .send(csv);
  });
}
