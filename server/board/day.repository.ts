// What a board day reads besides its jobs: the saved pass plans and hazards of its fields, and the
// farm's people (who may be given field work).
import type { Operation } from '../../shared/operations';
import type { SkillLevel } from '../../shared/schemas/fleet';
import type { Tx } from '../db/knex';
import type { DbHazardRow } from '../fields/fields.repository';
import type { DbPassPlanRow } from './board.rows';

export const passPlansOf = (db: Tx, farmId: number, fieldIds: number[]): Promise<DbPassPlanRow[]> =>
  fieldIds.length ? db<DbPassPlanRow>('pass_plans').where({ farm_id: farmId }).whereIn('field_id', fieldIds) : Promise.resolve([]);

export interface PersonRow {
  membership_id: number;
  name: string;
  email: string;
  role: 'owner' | 'operator' | 'viewer';
  status: 'invited' | 'active' | 'removed';
}

export const peopleOfFarm = (db: Tx, farmId: number): Promise<PersonRow[]> =>
  db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.farm_id', farmId)
    .orderBy('u.name')
    .select('m.id as membership_id', 'u.name', 'u.email', 'm.role', 'm.status');

/** A member who may be given field work: active, owner or operator. */
export const assignablePerson = (db: Tx, farmId: number, membershipId: number): Promise<PersonRow | undefined> =>
  db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.farm_id': farmId, 'm.id': membershipId, 'm.status': 'active' })
    .whereIn('m.role', ['owner', 'operator'])
    .first('m.id as membership_id', 'u.name', 'u.email', 'm.role', 'm.status');

/** The hazards of the given fields, in the order they were marked. */
export const hazardsOfFields = (db: Tx, farmId: number, fieldIds: number[]): Promise<DbHazardRow[]> =>
  fieldIds.length ? db<DbHazardRow>('hazards').where({ farm_id: farmId }).whereIn('field_id', fieldIds).orderBy('id') : Promise.resolve([]);

/** A person's skill for an operation, or null when they have none. */
export async function skillOf(db: Tx, farmId: number, membershipId: number, operation: Operation): Promise<SkillLevel | null> {
  const row = await db('crew_skills').where({ farm_id: farmId, membership_id: membershipId, operation }).first('level');
  return (row?.level as SkillLevel | undefined) ?? null;
}

/** The first day after `day` with at least one card on the farm's board, or null. */
export async function nextDayWithWork(db: Tx, farmId: number, day: string): Promise<string | null> {
  const row = await db('assignments')
    .where({ farm_id: farmId })
    .where('day', '>', day)
    .first(db.raw(`to_char(min(day), 'YYYY-MM-DD') as day`));
  return (row?.day as string | null | undefined) ?? null;
}

/** A machine's oldest open breakdown report: the machine is down from then until the owner reviews it. */
export interface MachineDownRow {
  machine_id: number;
  at: Date;
  note: string | null;
}

/**
 * The machines among `machineIds` with an open breakdown report from a run sheet, each with its
 * oldest open one (server/reports lists the same reports for the owner).
 */
export async function machinesReportedDown(db: Tx, farmId: number, machineIds: number[]): Promise<MachineDownRow[]> {
  if (!machineIds.length) return [];
  const rows: MachineDownRow[] = await db('assignment_events as e')
    .join('assignments as a', 'a.id', 'e.assignment_id')
    .where({ 'e.farm_id': farmId, 'e.type': 'problem', 'e.reason': 'breakdown', 'e.review': 'open' })
    .whereIn('a.machine_id', machineIds)
    .orderBy([{ column: 'e.at' }, { column: 'e.id' }])
    .select('a.machine_id', 'e.at', 'e.note');
  const first = new Map<number, MachineDownRow>();
  for (const r of rows) if (!first.has(r.machine_id)) first.set(r.machine_id, r);
  return [...first.values()];
}
