// Task data for a tractor terminal (ISO 11783-10): a day of the board for the owner, one job for
// the owner or the job's operator. The database is read here; the file is built in a compute
// worker (build-taskdata.ts), as plans are.
import { OPERATION_INFO } from '../../shared/operations';
import { HAZARD_LABELS, type HazardKind } from '../../shared/schemas/fields';
import type { AppDeps } from '../app-deps';
import { AppError, forbidden, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import type { TaskDataField, TaskDataInput } from './build-taskdata';
import * as repo from './taskdata.repository';

async function inputOf(deps: AppDeps, farmId: number, jobs: repo.TaskDataJobRow[]): Promise<TaskDataInput> {
  const db = deps.db;
  const fieldIds = [...new Set(jobs.map((j) => j.field_id))];
  const operatorIds = [...new Set(jobs.map((j) => j.operator_id))];
  const [{ farmName, ownerName }, fields, hazards, plans, people] = await Promise.all([
    repo.farmAndOwner(db, farmId),
    repo.fieldsByIds(db, farmId, fieldIds),
    repo.hazardsOf(db, farmId, fieldIds),
    repo.plansOf(db, farmId, fieldIds),
    repo.peopleNamed(db, farmId, operatorIds),
  ]);
  // Only the plans of the operations the jobs do: a field's guidance for the work in hand.
  const wanted = new Set(jobs.map((j) => `${j.field_id}|${j.operation}`));
  const out: TaskDataField[] = fields.map((f) => ({
    id: f.id,
    name: f.name,
    boundary: f.boundary,
    areaM2: f.area_m2,
    hazards: hazards
      .filter((h) => h.field_id === f.id)
      .map((h) => ({ id: h.id, label: HAZARD_LABELS[h.kind as HazardKind] ?? h.kind, geometry: h.geometry, clearanceM: h.clearance_m })),
    plans: Object.fromEntries(
      plans
        .filter((p) => p.field_id === f.id && wanted.has(`${f.id}|${p.operation}`))
        .map((p) => [
          p.operation,
          {
            label: OPERATION_INFO[p.operation].label,
            widthM: p.width_m,
            headlandPasses: p.headland_passes,
            headingDeg: p.heading_deg ?? p.summary.headingDeg,
          },
        ]),
    ),
  }));
  return {
    farm: { name: farmName },
    customer: { name: ownerName },
    fields: out,
    workers: people.map((p) => ({ id: p.id, name: p.name })),
    jobs: jobs.map((j) => ({
      id: j.id,
      fieldId: j.field_id,
      operation: j.operation,
      label: `${OPERATION_INFO[j.operation].label}, ${j.field_name}`,
      workerId: j.operator_id,
      state: j.state,
    })),
  };
}

/** Every job of a board day as task data (the owner's). */
export async function dayTaskData(deps: AppDeps, by: SessionPrincipal, day: string): Promise<Uint8Array> {
  const jobs = await repo.jobsOfDay(deps.db, by.farmId, day);
  if (jobs.length === 0)
    throw new AppError(404, 'not_found', `There are no jobs on the board for ${day}, so there is no task data to send`);
  return deps.compute.run('buildTaskData', await inputOf(deps, by.farmId, jobs));
}

/** One job as task data: the owner's, or its operator's. */
export async function jobTaskData(deps: AppDeps, by: SessionPrincipal, id: number): Promise<{ day: string; data: Uint8Array }> {
  const job = await repo.jobById(deps.db, by.farmId, id);
  if (!job) throw notFound('That job');
  if (by.role !== 'owner' && job.operator_id !== by.membershipId) throw forbidden("This job is on someone else's run sheet");
  return { day: job.day, data: await deps.compute.run('buildTaskData', await inputOf(deps, by.farmId, [job])) };
}
