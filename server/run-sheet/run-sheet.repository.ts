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

/**
 * The day a person's run sheet opens on: today when they have a job today (in any state: a day
 * already worked is still their day), else the first later day whose board is published and holds
 * a job of theirs (as operator or mentor) that is not called off; null when there is none.
 */
export async function nextDayWithWork(db: Tx, farmId: number, personId: number, today: string): Promise<string | null> {
  const row = await db('assignments as a')
    .leftJoin('board_days as d', (j) => j.on('d.farm_id', 'a.farm_id').andOn('d.day', 'a.day'))
    .where('a.farm_id', farmId)
    .andWhere((q) => {
      q.where('a.operator_id', personId).orWhere('a.mentor_id', personId);
    })
    .andWhere((q) => {
      q.where('a.day', today).orWhere((later) => {
        later.where('a.day', '>', today).whereNotNull('d.published_at').whereNot('a.state', 'called-off');
      });
    })
    .min<{ day: string | null }>({ day: 'a.day' })
    .first();
  return row?.day ?? null;
}
