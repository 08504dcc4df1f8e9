import type { Operation } from '../../shared/operations';
import type { SkillLevel } from '../../shared/schemas/fleet';
import type { Tx } from '../db/knex';
import { MEMBER_NAME_SQL } from '../db/member-name';

export interface CrewRow {
  membership_id: number;
  name: string;
  role: 'owner' | 'operator' | 'viewer';
  status: 'invited' | 'active';
}

export interface SkillRow {
  membership_id: number;
  operation: Operation;
  level: SkillLevel;
}

/** Members who are on the farm now (active or invited), owners first. */
export const listCrew = (db: Tx, farmId: number): Promise<CrewRow[]> =>
  db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.farm_id', farmId)
    .whereIn('m.status', ['active', 'invited'])
    .orderBy([{ column: 'm.role' }, { column: 'u.name' }])
    .select('m.id as membership_id', db.raw(`${MEMBER_NAME_SQL} as name`), 'm.role', 'm.status');

export const getCrewMember = (db: Tx, farmId: number, membershipId: number): Promise<CrewRow | undefined> =>
  db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.farm_id': farmId, 'm.id': membershipId })
    .whereIn('m.status', ['active', 'invited'])
    .first('m.id as membership_id', db.raw(`${MEMBER_NAME_SQL} as name`), 'm.role', 'm.status');

export const skillsOfFarm = (db: Tx, farmId: number): Promise<SkillRow[]> =>
  db('crew_skills').where({ farm_id: farmId }).select('membership_id', 'operation', 'level');

export async function setSkill(
  db: Tx,
  farmId: number,
  membershipId: number,
  operation: Operation,
  level: SkillLevel | 'none',
): Promise<void> {
  if (level === 'none') {
    await db('crew_skills').where({ farm_id: farmId, membership_id: membershipId, operation }).delete();
    return;
  }
  await db('crew_skills')
    .insert({ farm_id: farmId, membership_id: membershipId, operation, level })
    .onConflict(['membership_id', 'operation'])
    .merge({ level, updated_at: db.fn.now() });
}
