import type { Tx } from '../db/knex';
import type { DbAuthTokenRow, DbFarmRow, DbMembershipRow, DbUserRow } from '../db/rows';
import type { SessionPrincipal } from '../http/session-user';

export const findUserByEmail = (db: Tx, email: string) => db<DbUserRow>('users').where({ email: email.toLowerCase() }).first();
export const findUserById = (db: Tx, id: number) => db<DbUserRow>('users').where({ id }).first();

export async function createUser(db: Tx, u: { email: string; name: string; passwordHash: string | null }): Promise<DbUserRow> {
  const [row] = await db<DbUserRow>('users')
    .insert({ email: u.email.toLowerCase(), name: u.name, password_hash: u.passwordHash })
    .returning('*');
  return row;
}

/**
 * Sets a new password. Every session signed in before `now` stops working (they are deleted, and
 * a copy a server still holds finds no principal): a new password signs the person out elsewhere.
 */
export async function setPasswordHash(db: Tx, userId: number, hash: string, name?: string, now = new Date()): Promise<void> {
  await db('users')
    .where({ id: userId })
    .update({ password_hash: hash, sessions_revoked_at: now, ...(name ? { name } : {}) });
  await db('session').whereRaw(`(sess->'passport'->'user'->>'userId')::int = ?`, [userId]).delete();
}

/**
 * The principal for a user acting in one membership, or nothing if it is not active. Every
 * signed-in request runs it (see `createSessionStore`), so it is plain SQL, kept here once, and
 * sent there as a named (prepared) statement: PostgreSQL plans the join once per connection.
 */
export const PRINCIPAL_SQL = `
  select u.id, u.email, u.name, m.id as "membershipId", f.id as "farmId", f.name as "farmName", f.units, f.time_zone as "timeZone", m.role,
         coalesce(r.revision, 0)::text as "farmRevision"
  from memberships m
  join users u on u.id = m.user_id
  join farms f on f.id = m.farm_id
  left join farm_revisions r on r.farm_id = m.farm_id
  where m.id = ? and m.user_id = ? and m.status = 'active'
    and (u.sessions_revoked_at is null or u.sessions_revoked_at <= ?)`;

/**
 * The principal for a user acting in one membership, or undefined if it is not active or if the
 * sign-in (at `signedInAt`) is older than the person's last new password.
 */
export async function loadPrincipal(
  db: Tx,
  userId: number,
  membershipId: number,
  signedInAt = new Date(),
): Promise<SessionPrincipal | undefined> {
  const { rows } = await db.raw<{ rows: SessionPrincipal[] }>(PRINCIPAL_SQL, [membershipId, userId, signedInAt]);
  return rows[0];
}

/** The invitation (or membership) a link's person holds on its farm, unless the owner withdrew it. */
export const findOpenMembership = (db: Tx, userId: number, farmId: number): Promise<Pick<DbMembershipRow, 'id'> | undefined> =>
  db<DbMembershipRow>('memberships').where({ user_id: userId, farm_id: farmId }).whereIn('status', ['invited', 'active']).first('id');

/** An accepted invitation: the membership becomes active from now. */
export async function activateMembership(db: Tx, id: number): Promise<void> {
  await db('memberships').where({ id }).update({ status: 'active', joined_at: db.fn.now() });
}

/** A farm's name, for an invitation link's page. */
export async function farmName(db: Tx, farmId: number): Promise<string | null> {
  const farm = await db<DbFarmRow>('farms').where({ id: farmId }).first('name');
  return farm?.name ?? null;
}

/** The membership a user signs in to: their oldest active one. */
export const firstActiveMembership = (db: Tx, userId: number) =>
  db<DbMembershipRow>('memberships').where({ user_id: userId, status: 'active' }).orderBy('id').first();

export async function insertToken(
  db: Tx,
  t: { userId: number; farmId: number | null; kind: 'invite' | 'reset'; hash: string; expiresAt: Date },
) {
  await db<DbAuthTokenRow>('auth_tokens').insert({
    user_id: t.userId,
    farm_id: t.farmId,
    kind: t.kind,
    token_hash: t.hash,
    expires_at: t.expiresAt,
  });
}

export const findTokenForUpdate = (db: Tx, hash: string) =>
  db<DbAuthTokenRow>('auth_tokens').where({ token_hash: hash }).forUpdate().first();
export const findToken = (db: Tx, hash: string) => db<DbAuthTokenRow>('auth_tokens').where({ token_hash: hash }).first();

export async function markTokenUsed(db: Tx, id: number): Promise<void> {
  await db('auth_tokens').where({ id }).update({ used_at: db.fn.now() });
}

/** A new link makes older unused links of the same kind for that person void. */
export async function voidOpenTokens(db: Tx, userId: number, kind: 'invite' | 'reset'): Promise<void> {
  await db('auth_tokens').where({ user_id: userId, kind }).whereNull('used_at').update({ used_at: db.fn.now() });
}
