import { farmPatchBody } from '../../shared/schemas/farm';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body } from '../http/validate';
import { getFarmSettings, updateFarmSettings } from './farm.repository';

/** The farm's own settings: name, units (US customary or metric), a day's hour limit, time zone. */
export function farmRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', 'member', async (req, res) => {
    res.json(await getFarmSettings(deps.db, principal(req).farmId));
  });
  r.patch('/', ['owner'], async (req, res) => {
    const farmId = principal(req).farmId;
    await updateFarmSettings(deps.db, farmId, body(req, farmPatchBody));
    res.json(await getFarmSettings(deps.db, farmId));
  });
}
