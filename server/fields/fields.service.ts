// Fields of a farm: boundaries (checked and measured on the ellipsoid), hazards and crop plans.
// Every query is scoped by the farm of the signed-in member.
import type { Feature, FeatureCollection, Geometry, MultiPolygon, Polygon } from 'geojson';
import {
  isNameProblem,
  type BoundaryOverlap,
  type FieldDetail,
  type FieldHazardProperties,
  type FieldSummary,
  type ImportPreview,
} from '../../shared/schemas/fields';
import { acresToHa } from '../../shared/units';
import type { AppDeps } from '../app-deps';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import { checkHazardGeometry, measureBoundary, type MeasuredBoundary } from './geometry';
import * as repo from './fields.repository';
import { roundTo } from '../../shared/round';
import { yearIn } from '../../shared/calendar';

/** The season a farm is in now: the calendar year at the farm. */
export const currentSeason = (timeZone: string): number => yearIn(timeZone);

const nameTaken = (name: string) =>
  new AppError(409, 'name_taken', `There is already a field called "${name}" on this farm; choose another name`, {
    name: 'Name already used',
  });

export function hazardFeature(h: repo.DbHazardRow): Feature<Geometry> {
  return {
    type: 'Feature',
    id: h.id,
    geometry: h.geometry,
    properties: { id: h.id, fieldId: h.field_id, kind: h.kind, clearanceM: h.clearance_m, note: h.note, status: h.status },
  };
}

export async function listFields(deps: AppDeps, farmId: number, season: number): Promise<FieldSummary[]> {
  const rows = await repo.listFields(deps.db, farmId, season);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    // To 0.0001 like a field's own page: the screen rounds once, to its one decimal. Two decimals
    // here rounded twice (152.8468 → 152.85 → "152.9" in the list, "152.8" everywhere else).
    acres: roundTo(r.acres, 4),
    hectares: roundTo(acresToHa(r.acres), 4),
    crop: r.crop,
    hazardCount: r.hazard_count,
    lastOperation: r.last_operation ? { operation: r.last_operation, date: r.last_operation_day! } : null,
    boundary: r.boundary,
  }));
}

export async function getField(deps: AppDeps, farmId: number, id: number, season: number): Promise<FieldDetail> {
  const f = await repo.getField(deps.db, farmId, id);
  if (!f) throw notFound('That field');
  const hazards = await repo.hazardsOfField(deps.db, farmId, id);
  const crops = await repo.cropsOfField(deps.db, farmId, id);
  return {
    id: f.id,
    name: f.name,
    acres: roundTo(f.acres, 4),
    hectares: roundTo(acresToHa(f.acres), 4),
    areaM2: f.area_m2,
    notes: f.notes,
    boundary: f.boundary,
    hazards: { type: 'FeatureCollection', features: hazards.map(hazardFeature) } as FeatureCollection<Geometry, FieldHazardProperties>,
    crop: crops.find((c) => c.season === season)?.crop ?? null,
    crops,
    updatedAt: f.updated_at.toISOString(),
  };
}

/** Creates a field; `measured` skips the boundary check when the caller has just made it (an import). */
export async function createField(
  deps: AppDeps,
  farmId: number,
  input: { name: string; boundary: unknown; notes?: string },
  db: Tx = deps.db,
  measured?: MeasuredBoundary,
): Promise<number> {
  const m = measured ?? (await measureBoundary(deps.compute, input.boundary, input.name));
  if (await repo.fieldNameTaken(db, farmId, input.name)) throw nameTaken(input.name);
  try {
    return await repo.insertField(db, {
      farmId,
      name: input.name,
      boundary: m.boundary,
      areaM2: m.areaM2,
      acres: m.acres,
      notes: input.notes,
    });
  } catch (err) {
    if ((err as { code?: string }).code === '23505') throw nameTaken(input.name);
    throw err;
  }
}

export async function updateField(
  deps: AppDeps,
  farmId: number,
  id: number,
  patch: { name?: string; boundary?: unknown; notes?: string | null },
): Promise<void> {
  const f = await repo.getField(deps.db, farmId, id);
  if (!f) throw notFound('That field');
  const name = patch.name ?? f.name;
  const measured = patch.boundary !== undefined ? await measureBoundary(deps.compute, patch.boundary, name) : null;
  if (patch.name && (await repo.fieldNameTaken(deps.db, farmId, patch.name, id))) throw nameTaken(patch.name);
  await repo.updateField(deps.db, id, {
    name: patch.name,
    notes: patch.notes,
    ...(measured ? { boundary: measured.boundary, areaM2: measured.areaM2, acres: measured.acres } : {}),
  });
}

/**
 * For each boundary, the farm's fields it overlaps (shared/geo/overlap), compared in a compute
 * worker (boundaries may be large). `exceptId` leaves out the field itself when it is redrawn.
 */
async function overlapsOf(
  deps: AppDeps,
  farmId: number,
  boundaries: Array<{ boundary: Polygon | MultiPolygon | null; exceptId?: number }>,
): Promise<BoundaryOverlap[][]> {
  if (!boundaries.some((b) => b.boundary)) return boundaries.map(() => []);
  const fields = await repo.fieldBoundaries(deps.db, farmId);
  if (!fields.length) return boundaries.map(() => []);
  return deps.compute.run('findFieldOverlaps', { boundaries, fields });
}

/** The farm's other fields that a saved field overlaps: the warning on creating or redrawing it. */
export async function overlapsOfField(deps: AppDeps, farmId: number, id: number): Promise<BoundaryOverlap[]> {
  const f = await repo.getField(deps.db, farmId, id);
  if (!f) return [];
  const [found] = await overlapsOf(deps, farmId, [{ boundary: f.boundary, exceptId: id }]);
  return found;
}

/** An import preview with, on each feature that can be saved, the farm's fields it overlaps. */
export async function withOverlaps(deps: AppDeps, farmId: number, preview: ImportPreview): Promise<ImportPreview> {
  const usable = (f: ImportPreview['features'][number]) => f.acres !== null && f.problems.every((p) => isNameProblem(p.code));
  const found = await overlapsOf(
    deps,
    farmId,
    preview.features.map((f) => ({ boundary: usable(f) ? (f.geometry as Polygon | MultiPolygon) : null })),
  );
  return { ...preview, features: preview.features.map((f, i) => ({ ...f, overlaps: found[i] })) };
}

export async function deleteField(deps: AppDeps, farmId: number, id: number): Promise<void> {
  const n = await repo.deleteField(deps.db, farmId, id);
  if (!n) throw notFound('That field');
}

async function fieldOr404(deps: AppDeps, farmId: number, fieldId: number): Promise<repo.DbFieldRow> {
  const f = await repo.getField(deps.db, farmId, fieldId);
  if (!f) throw notFound('That field');
  return f;
}

export async function addHazard(
  deps: AppDeps,
  farmId: number,
  fieldId: number,
  h: { kind: string; geometry: unknown; clearanceM: number; note?: string | null },
  status: 'confirmed' | 'reported' = 'confirmed',
): Promise<Feature> {
  await fieldOr404(deps, farmId, fieldId);
  const geometry = checkHazardGeometry(h.geometry);
  const id = await repo.insertHazard(deps.db, {
    farm_id: farmId,
    field_id: fieldId,
    kind: h.kind,
    geometry,
    clearance_m: h.clearanceM,
    note: h.note ?? null,
    status,
  });
  return hazardFeature((await repo.getHazard(deps.db, farmId, fieldId, id))!);
}

export async function updateHazard(
  deps: AppDeps,
  farmId: number,
  fieldId: number,
  id: number,
  patch: { kind?: string; geometry?: unknown; clearanceM?: number; note?: string | null; status?: 'confirmed' },
): Promise<Feature> {
  const h = await repo.getHazard(deps.db, farmId, fieldId, id);
  if (!h) throw notFound('That hazard');
  await repo.updateHazard(deps.db, id, {
    kind: patch.kind,
    geometry: patch.geometry !== undefined ? checkHazardGeometry(patch.geometry) : undefined,
    clearance_m: patch.clearanceM,
    note: patch.note,
    status: patch.status,
  });
  return hazardFeature((await repo.getHazard(deps.db, farmId, fieldId, id))!);
}

export async function deleteHazard(deps: AppDeps, farmId: number, fieldId: number, id: number): Promise<void> {
  const h = await repo.getHazard(deps.db, farmId, fieldId, id);
  if (!h) throw notFound('That hazard');
  await repo.deleteHazard(deps.db, id);
}

export async function setCropPlan(
  deps: AppDeps,
  farmId: number,
  fieldId: number,
  season: number,
  crop: string,
  varietyNote: string | null,
): Promise<void> {
  await fieldOr404(deps, farmId, fieldId);
  await repo.upsertCropPlan(deps.db, { farmId, fieldId, season, crop, varietyNote });
}

export async function clearCropPlan(deps: AppDeps, farmId: number, fieldId: number, season: number): Promise<void> {
  await fieldOr404(deps, farmId, fieldId);
  await repo.deleteCropPlan(deps.db, farmId, fieldId, season);
}

export async function listCropPlans(deps: AppDeps, farmId: number, season: number) {
  const rows = await repo.cropPlans(deps.db, farmId, season);
  return rows.map((r) => ({ fieldId: r.field_id, season: r.season, crop: r.crop, varietyNote: r.variety_note }));
}

export async function copyCropPlans(deps: AppDeps, farmId: number, from: number, to: number): Promise<{ copied: number }> {
  if (from === to) throw new AppError(400, 'invalid_input', 'Choose two different seasons');
  return { copied: await repo.copyCropPlans(deps.db, farmId, from, to) };
}

/** All fields and their hazards as one GeoJSON FeatureCollection (RFC 7946). */
export async function exportGeoJson(deps: AppDeps, farmId: number, season: number): Promise<FeatureCollection> {
  const fields = await repo.listFields(deps.db, farmId, season);
  const names = new Map(fields.map((f) => [f.id, f.name]));
  const hazards = await repo.hazardsOfFarm(deps.db, farmId);
  const features: Feature[] = fields.map((f) => ({
    type: 'Feature',
    geometry: f.boundary as Polygon | MultiPolygon,
    properties: {
      type: 'field',
      id: f.id,
      name: f.name,
      acres: roundTo(f.acres, 4),
      hectares: roundTo(acresToHa(f.acres), 4),
      crop: f.crop,
      season,
    },
  }));
  for (const h of hazards) {
    const feat = hazardFeature(h);
    feat.properties = { type: 'hazard', field: names.get(h.field_id) ?? null, ...feat.properties };
    features.push(feat);
  }
  return { type: 'FeatureCollection', features };
}
