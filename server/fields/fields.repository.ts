import type { Geometry, MultiPolygon, Polygon } from 'geojson';
import type { Tx } from '../db/knex';

export interface DbFieldRow {
  id: number;
  farm_id: number;
  name: string;
  boundary: Polygon | MultiPolygon;
  area_m2: number;
  acres: number;
  notes: string | null;
  created_at: Date;
  updated_at: Date;
}

export interface DbHazardRow {
  id: number;
  farm_id: number;
  field_id: number;
  kind: string;
  geometry: Geometry;
  clearance_m: number;
  note: string | null;
  status: 'confirmed' | 'reported';
  created_at: Date;
}

export interface DbCropPlanRow {
  id: number;
  farm_id: number;
  field_id: number;
  season: number;
  crop: string;
  variety_note: string | null;
}

export interface FieldListRow extends DbFieldRow {
  crop: string | null;
  hazard_count: number;
  last_operation: string | null;
  last_operation_day: string | null;
}

export function listFields(db: Tx, farmId: number, season: number): Promise<FieldListRow[]> {
  return (
    db('fields as f')
      .leftJoin('crop_plans as c', (j) => j.on('c.field_id', 'f.id').andOn('c.season', db.raw('?', [season])))
      // The last job finished on the field (any season), for the fields table: one lookup per field.
      .joinRaw(
        `left join lateral (select a.operation, a.day from assignments a
           where a.field_id = f.id and a.state = 'finished' order by a.day desc, a.finished_at desc nulls last limit 1) last on true`,
      )
      .where('f.farm_id', farmId)
      .orderByRaw('lower(f.name)')
      .select(
        'f.*',
        'c.crop',
        db.raw('(select count(*)::int from hazards h where h.field_id = f.id) as hazard_count'),
        'last.operation as last_operation',
        'last.day as last_operation_day',
      )
  );
}

export const getField = (db: Tx, farmId: number, id: number) => db<DbFieldRow>('fields').where({ farm_id: farmId, id }).first();

/** Every field's id, name and boundary: what a new or redrawn boundary is compared with for overlaps. */
export const fieldBoundaries = (db: Tx, farmId: number): Promise<Array<Pick<DbFieldRow, 'id' | 'name' | 'boundary'>>> =>
  db<DbFieldRow>('fields').where('farm_id', farmId).select('id', 'name', 'boundary');

export const fieldNameTaken = async (db: Tx, farmId: number, name: string, exceptId?: number): Promise<boolean> => {
  const q = db('fields').where('farm_id', farmId).whereRaw('lower(name) = lower(?)', [name]);
  if (exceptId) q.whereNot('id', exceptId);
  return !!(await q.first('id'));
};

export async function insertField(
  db: Tx,
  f: { farmId: number; name: string; boundary: Polygon | MultiPolygon; areaM2: number; acres: number; notes?: string | null },
): Promise<number> {
  const [row] = await db('fields')
    .insert({
      farm_id: f.farmId,
      name: f.name,
      boundary: JSON.stringify(f.boundary),
      area_m2: f.areaM2,
      acres: f.acres,
      notes: f.notes ?? null,
    })
    .returning('id');
  return row.id;
}

export async function updateField(
  db: Tx,
  id: number,
  patch: Partial<{ name: string; boundary: Polygon | MultiPolygon; areaM2: number; acres: number; notes: string | null }>,
): Promise<void> {
  const cols: Record<string, unknown> = { updated_at: db.fn.now() };
  if (patch.name !== undefined) cols.name = patch.name;
  if (patch.boundary !== undefined) cols.boundary = JSON.stringify(patch.boundary);
  if (patch.areaM2 !== undefined) cols.area_m2 = patch.areaM2;
  if (patch.acres !== undefined) cols.acres = patch.acres;
  if (patch.notes !== undefined) cols.notes = patch.notes;
  await db('fields').where({ id }).update(cols);
}

export const deleteField = (db: Tx, farmId: number, id: number) => db('fields').where({ farm_id: farmId, id }).delete();

export const hazardsOfField = (db: Tx, farmId: number, fieldId: number) =>
  db<DbHazardRow>('hazards').where({ farm_id: farmId, field_id: fieldId }).orderBy('id');

export const hazardsOfFarm = (db: Tx, farmId: number) => db<DbHazardRow>('hazards').where({ farm_id: farmId }).orderBy('id');

export const getHazard = (db: Tx, farmId: number, fieldId: number, id: number) =>
  db<DbHazardRow>('hazards').where({ farm_id: farmId, field_id: fieldId, id }).first();

export async function insertHazard(db: Tx, h: Omit<DbHazardRow, 'id' | 'created_at'>): Promise<number> {
  const [row] = await db('hazards')
    .insert({ ...h, geometry: JSON.stringify(h.geometry) })
    .returning('id');
  return row.id;
}

export async function updateHazard(
  db: Tx,
  id: number,
  patch: Partial<Pick<DbHazardRow, 'kind' | 'geometry' | 'clearance_m' | 'note' | 'status'>>,
): Promise<void> {
  const cols: Record<string, unknown> = { ...patch };
  if (patch.geometry) cols.geometry = JSON.stringify(patch.geometry);
  await db('hazards').where({ id }).update(cols);
}

export const deleteHazard = (db: Tx, id: number) => db('hazards').where({ id }).delete();

/** Every season's crop of one field, newest season first. */
export const cropsOfField = (
  db: Tx,
  farmId: number,
  fieldId: number,
): Promise<Array<{ season: number; crop: string; varietyNote: string | null }>> =>
  db('crop_plans')
    .where({ farm_id: farmId, field_id: fieldId })
    .orderBy('season', 'desc')
    .select('season', 'crop', 'variety_note as varietyNote');

export const cropPlans = (db: Tx, farmId: number, season: number) =>
  db<DbCropPlanRow>('crop_plans').where({ farm_id: farmId, season }).orderBy('field_id');

export async function upsertCropPlan(
  db: Tx,
  p: { farmId: number; fieldId: number; season: number; crop: string; varietyNote: string | null },
): Promise<void> {
  await db('crop_plans')
    .insert({ farm_id: p.farmId, field_id: p.fieldId, season: p.season, crop: p.crop, variety_note: p.varietyNote })
    .onConflict(['field_id', 'season'])
    .merge(['crop', 'variety_note']);
}

export const deleteCropPlan = (db: Tx, farmId: number, fieldId: number, season: number) =>
  db('crop_plans').where({ farm_id: farmId, field_id: fieldId, season }).delete();

/** Copies one season's plans to another for the fields that have none there yet. */
export async function copyCropPlans(db: Tx, farmId: number, from: number, to: number): Promise<number> {
  const res = await db.raw(
    `insert into crop_plans (farm_id, field_id, season, crop, variety_note)
     select farm_id, field_id, ?, crop, variety_note from crop_plans where farm_id = ? and season = ?
     on conflict (field_id, season) do nothing`,
    [to, farmId, from],
  );
  return res.rowCount as number;
}
