// Pass plans: computed by the shared planner (the same code the browser runs), saved per field
// and operation with the figures the board, the work orders and the season report read back.
import type { FeatureCollection, LineString } from 'geojson';
import { OPERATION_INFO, type Operation } from '../../shared/operations';
import type { PassProperties, PlanInput, PlanResult } from '../../shared/plan/types';
import type { PlanSummary, SavedPlan } from '../../shared/schemas/plans';
import type { planSettings } from '../../shared/schemas/plans';
import type * as z from 'zod';
import type { AppDeps } from '../app-deps';
import { AppError, notFound } from '../http/errors';
import { getField, hazardsOfField } from '../fields/fields.repository';
import { hazardFeature } from '../fields/fields.service';
import { getImplement } from '../fleet/implements.repository';
import { mphToMps } from '../../shared/units';
import * as repo from './plans.repository';

type Settings = z.infer<typeof planSettings>;

/**
 * Runs the planner in a compute worker (time and memory limited); its plain errors (width wider
 * than the field, headland erases it, over the plan budget…) become 422s.
 */
export function computePlan(deps: AppDeps, input: PlanInput): Promise<PlanResult> {
  return deps.compute.run('plan', input);
}

export function summaryOf(r: PlanResult): PlanSummary {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { headland, workRegion, hazardZones, passes, unworked, overlap, ...summary } = r;
  return summary;
}

async function fieldInput(deps: AppDeps, farmId: number, fieldId: number) {
  const field = await getField(deps.db, farmId, fieldId);
  if (!field) throw notFound('That field');
  const hazards = await hazardsOfField(deps.db, farmId, fieldId);
  return { field, hazards: { type: 'FeatureCollection', features: hazards.map(hazardFeature) } as FeatureCollection };
}

/**
 * The speed asked for, m/s: `speedMps`, or the mph an older client sends, converted exactly; both at
 * once is refused rather than one silently chosen.
 */
function speedOf(s: Settings): number | undefined {
  if (s.speedMps !== undefined && s.speedMph !== undefined)
    throw new AppError(400, 'invalid_input', 'Send the speed once: speedMps (metres per second) or speedMph, not both', {
      speedMps: 'Send the speed once',
    });
  return s.speedMph !== undefined ? mphToMps(s.speedMph) : s.speedMps;
}

function inputOf(s: Settings, operation: Operation | undefined): Omit<PlanInput, 'boundary'> {
  return {
    widthM: s.widthM,
    headlandPasses: s.headlandPasses,
    headingDeg: s.headingDeg,
    edgeMarginPct: s.edgeMarginPct,
    speedMps: speedOf(s),
    efficiency: s.efficiency,
    turnSeconds: s.turnSeconds,
    implementKind: s.implementKind,
    coverage: s.coverage ?? (operation ? OPERATION_INFO[operation].coverage : undefined),
  };
}

export async function preview(
  deps: AppDeps,
  farmId: number,
  body: Settings & { fieldId?: number; boundary?: unknown; hazards?: unknown; operation?: Operation; fieldName?: string },
): Promise<PlanResult> {
  if (body.fieldId) {
    const { field, hazards } = await fieldInput(deps, farmId, body.fieldId);
    return computePlan(deps, { ...inputOf(body, body.operation), boundary: field.boundary, hazards, fieldName: field.name });
  }
  if (!body.boundary) throw new AppError(400, 'invalid_input', 'Send a field id or a boundary to plan', { fieldId: 'Choose a field' });
  return computePlan(deps, {
    ...inputOf(body, body.operation),
    boundary: body.boundary as PlanInput['boundary'],
    hazards: body.hazards as FeatureCollection | undefined,
    fieldName: body.fieldName,
  });
}

const toSaved = (r: repo.DbPlanRow): SavedPlan => ({
  id: r.id,
  fieldId: r.field_id,
  fieldName: r.field_name,
  operation: r.operation,
  implementId: r.implement_id,
  implementName: r.implement_name,
  implementWidthM: r.implement_width_m === null ? null : Number(r.implement_width_m),
  widthM: r.width_m,
  headlandPasses: r.headland_passes,
  headingDeg: r.heading_deg,
  coverage: r.coverage,
  speedMps: r.speed_mps,
  efficiency: r.efficiency,
  turnSeconds: r.turn_seconds,
  summary: r.summary,
  updatedAt: r.updated_at.toISOString(),
});

export async function listPlans(deps: AppDeps, farmId: number, fieldId?: number): Promise<SavedPlan[]> {
  return (await repo.listPlanRows(deps.db, farmId, fieldId)).map(toSaved);
}

export async function getPlan(
  deps: AppDeps,
  farmId: number,
  fieldId: number,
  operation: Operation,
): Promise<SavedPlan & { result: PlanResult }> {
  const row = await repo.findPlanRow(deps.db, farmId, fieldId, operation);
  if (!row) throw notFound(`A saved ${OPERATION_INFO[operation].label.toLowerCase()} plan for that field`);
  const saved = toSaved(row);
  const { field, hazards } = await fieldInput(deps, farmId, fieldId);
  const result = await computePlan(deps, {
    boundary: field.boundary,
    hazards,
    fieldName: field.name,
    widthM: saved.widthM,
    headlandPasses: saved.headlandPasses,
    headingDeg: saved.headingDeg ?? saved.summary.headingDeg,
    edgeMarginPct: saved.summary.edgeMarginPct,
    speedMps: saved.speedMps,
    efficiency: saved.efficiency,
    turnSeconds: saved.turnSeconds,
    coverage: saved.coverage,
  });
  return { ...saved, result };
}

export async function savePlan(
  deps: AppDeps,
  farmId: number,
  userId: number,
  fieldId: number,
  operation: Operation,
  s: Settings,
): Promise<SavedPlan & { result: PlanResult }> {
  // The implement is checked before the plan is computed: a refusal costs no compute, and names
  // the form's field so the form can mark it.
  if (s.implementId && !(await getImplement(deps.db, farmId, s.implementId)))
    throw new AppError(422, 'bad_implement', 'That implement is not in this farm’s fleet', {
      implementId: 'Choose an implement of this farm’s fleet',
    });
  const { field, hazards } = await fieldInput(deps, farmId, fieldId);
  const result = await computePlan(deps, { ...inputOf(s, operation), boundary: field.boundary, hazards, fieldName: field.name });
  await repo.upsertPlan(deps.db, {
    farm_id: farmId,
    field_id: fieldId,
    operation,
    implement_id: s.implementId ?? null,
    width_m: result.widthM,
    headland_passes: result.headlandPasses,
    heading_deg: s.headingDeg === undefined || s.headingDeg === 'auto' ? null : s.headingDeg,
    coverage: result.coverage,
    speed_mps: result.speedMps,
    efficiency: result.efficiency,
    turn_seconds: result.turnSeconds,
    summary: JSON.stringify(summaryOf(result)),
    updated_by: userId,
  });
  return getPlan(deps, farmId, fieldId, operation);
}

export async function deletePlan(deps: AppDeps, farmId: number, fieldId: number, operation: Operation): Promise<void> {
  const n = await repo.deletePlanRow(deps.db, farmId, fieldId, operation);
  if (!n) throw notFound('That pass plan');
}

/** The passes as GeoJSON LineStrings for a guidance display: pass number, segment, heading, length. */
export function passesGeoJson(
  plan: SavedPlan & { result: PlanResult },
): FeatureCollection<LineString, PassProperties & { field: string; operation: string }> {
  return {
    type: 'FeatureCollection',
    features: plan.result.passes.features.map((f) => ({
      ...f,
      properties: { ...f.properties, field: plan.fieldName, operation: plan.operation },
    })),
  };
}
