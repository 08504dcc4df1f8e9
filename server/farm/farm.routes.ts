import { farmPatchBody, type FarmSettings } from '../../shared/schemas/farm';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body } from '../http/validate';

async function read(deps: AppDeps, farmId: number): Promise<FarmSettings> {
  const f = await deps.db('farms').where({ id: farmId }).first();
  return { id: f.id, name: f.name, units: f.units, dayHoursLimit: f.day_hours_limit, timeZone: f.time_zone };
}

/** The farm's own settings: name, units (US customary or metric), a day's hour limit, time zone. */
export function farmRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', 'member', async (req, res) => {
    res.json(await read(deps, principal(req).farmId));
  });
  r.patch('/', ['owner'], async (req, res) => {
    const p = body(req, farmPatchBody);
    const farmId = principal(req).farmId;
    await deps
      .db('farms')
      .where({ id: farmId })
      .update({
        ...(p.name ? { name: p.name } : {}),
        ...(p.units ? { units: p.units } : {}),
        ...(p.dayHoursLimit ? { day_hours_limit: p.dayHoursLimit } : {}),
        ...(p.timeZone ? { time_zone: p.timeZone } : {}),
      });
    res.json(await read(deps, farmId));
  });
}
