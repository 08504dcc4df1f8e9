// What the run sheet reads of fields besides the board day: the boundaries it draws, the name it logs.
import type { MultiPolygon, Polygon } from 'geojson';
import type { Tx } from '../db/knex';

/** The boundaries of the given fields of a farm, by field id. */
export async function boundariesOf(db: Tx, farmId: number, fieldIds: number[]): Promise<Map<number, Polygon | MultiPolygon>> {
  const rows: Array<{ id: number; boundary: Polygon | MultiPolygon }> = fieldIds.length
    ? await db('fields').where({ farm_id: farmId }).whereIn('id', fieldIds).select('id', 'boundary')
    : [];
  return new Map(rows.map((f) => [f.id, f.boundary]));
}

/** A field's name, for the board's change log. */
export async function fieldName(db: Tx, farmId: number, fieldId: number): Promise<string> {
  const row = await db('fields').where({ farm_id: farmId, id: fieldId }).first('name');
  return row.name;
}
