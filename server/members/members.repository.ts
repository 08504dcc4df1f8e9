import { MEMBER_NAME_SQL } from '../db/member-name';
import type { Member, Role } from '../../shared/schemas/auth';
import type { Tx } from '../db/knex';
import type { DbMembershipRow } from '../db/rows';

const columns = (db: Tx) => [
  'm.id',
  db.raw(`CASE WHEN m.status = 'invited' THEN NULL ELSE m.user_id END as "userId"`),
  db.raw(`${MEMBER_NAME_SQL} as name`),
  'u.email',
  'm.role',
  'm.status',
  'm.invited_at as invitedAt',
];

function toMember(row: Record<string, unknown>): Member {
  const invitedAt = row.invitedAt as Date | null;
  return { ...(row as unknown as Member), invitedAt: invitedAt ? invitedAt.toISOString() : null };
}

export async function listMembers(db: Tx, farmId: number): Promise<Member[]> {
  const rows = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.farm_id', farmId)
    .whereIn('m.status', ['active', 'invited'])
    .orderBy([{ column: 'm.role' }, { column: 'name' }])
    .select(columns(db));
  return rows.map(toMember);
}

export async function getMember(db: Tx, farmId: number, id: number): Promise<Member | undefined> {
  const row = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.farm_id': farmId, 'm.id': id })
    .first(columns(db));
  return row ? toMember(row) : undefined;
}

export const findMembershipForUpdate = (db: Tx, farmId: number, id: number) =>
  db<DbMembershipRow>('memberships').where({ farm_id: farmId, id }).whereIn('status', ['active', 'invited']).forUpdate().first();

export const findMembershipOfUser = (db: Tx, farmId: number, userId: number) =>
  db<DbMembershipRow>('memberships').where({ farm_id: farmId, user_id: userId }).forUpdate().first();

/** Active owners on the farm, locked, so two owners cannot demote each other at once. */
export async function activeOwnerIds(db: Tx, farmId: number): Promise<number[]> {
  const rows = await db('memberships').where({ farm_id: farmId, role: 'owner', status: 'active' }).forUpdate().select('id');
  return rows.map((r: { id: number }) => r.id);
}

export async function insertMembership(
  db: Tx,
  m: { farmId: number; userId: number; role: Role; status: 'invited' | 'active'; invitedName?: string },
): Promise<number> {
  const [row] = await db('memberships')
    .insert({
      farm_id: m.farmId,
      user_id: m.userId,
      role: m.role,
      status: m.status,
      invited_name: m.invitedName ?? null,
      invited_at: db.fn.now(),
      joined_at: m.status === 'active' ? db.fn.now() : null,
    })
    .returning('id');
  return row.id;
}

export async function updateMembership(
  db: Tx,
  id: number,
  patch: Partial<Pick<DbMembershipRow, 'role' | 'status'>> & { removed?: boolean; reinvited?: boolean; invitedName?: string },
): Promise<void> {
  const { removed, reinvited, invitedName, ...cols } = patch;
  await db('memberships')
    .where({ id })
    .update({
      ...cols,
      ...(removed ? { removed_at: db.fn.now() } : {}),
      ...(reinvited ? { invited_at: db.fn.now(), removed_at: null, joined_at: null } : {}),
      ...(invitedName !== undefined ? { invited_name: invitedName } : {}),
    });
}
