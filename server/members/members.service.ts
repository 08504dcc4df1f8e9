// The owner's management of farm members. A farm always keeps at least one active owner;
// a removed member's row stays (status 'removed') so their logged work keeps its name.
import type { Member, Role } from '../../shared/schemas/auth';
import type { AppDeps } from '../app-deps';
import { invitationMail } from '../auth/auth.messages';
import { INVITE_DAYS, newToken } from '../auth/tokens';
import * as users from '../auth/users.repository';
import type { Tx } from '../db/knex';
import { AppError, notFound } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { enqueueMail } from '../mail/outbox.repository';
import * as repo from './members.repository';

export const listMembers = (deps: AppDeps, farmId: number): Promise<Member[]> => repo.listMembers(deps.db, farmId);

/**
 * Invites an address to the farm. The answer is the same whether or not the address already has
 * an account: the farm sees the name it typed (kept on the membership) until the person accepts,
 * and an existing account's own name is neither shown nor changed.
 */
export async function invite(deps: AppDeps, by: SessionPrincipal, input: { email: string; name: string; role: Role }): Promise<Member> {
  const id = await deps.db.transaction(async (tx) => {
    let user = await users.findUserByEmail(tx, input.email);
    user ??= await users.createUser(tx, { email: input.email, name: input.name, passwordHash: null });
    const existing = await repo.findMembershipOfUser(tx, by.farmId, user.id);
    let membershipId: number;
    if (existing && existing.status !== 'removed') {
      throw new AppError(
        409,
        'already_member',
        `${input.email} is already ${existing.status === 'invited' ? 'invited to' : 'a member of'} this farm`,
        { email: 'Already on this farm' },
      );
    } else if (existing) {
      await repo.updateMembership(tx, existing.id, { role: input.role, status: 'invited', reinvited: true, invitedName: input.name });
      membershipId = existing.id;
    } else {
      membershipId = await repo.insertMembership(tx, {
        farmId: by.farmId,
        userId: user.id,
        role: input.role,
        status: 'invited',
        invitedName: input.name,
      });
    }
    await users.voidOpenTokens(tx, user.id, 'invite');
    const token = newToken();
    await users.insertToken(tx, {
      userId: user.id,
      farmId: by.farmId,
      kind: 'invite',
      hash: token.hash,
      expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
    });
    const link = `${deps.config.publicUrl}/accept-invitation?token=${token.raw}`;
    await enqueueMail(
      tx,
      invitationMail({
        to: user.email,
        name: input.name,
        farmId: by.farmId,
        farmName: by.farmName,
        inviter: by.name,
        role: input.role,
        link,
        days: INVITE_DAYS,
      }),
    );
    return membershipId;
  });
  deps.nudgeMail();
  return (await repo.getMember(deps.db, by.farmId, id))!;
}

async function keepAnOwner(tx: Tx, farmId: number, membershipId: number): Promise<void> {
  const owners = await repo.activeOwnerIds(tx, farmId);
  if (owners.length === 1 && owners[0] === membershipId) {
    throw new AppError(409, 'last_owner', 'A farm needs at least one owner: make someone else owner first');
  }
}

export async function changeRole(deps: AppDeps, by: SessionPrincipal, id: number, role: Role): Promise<Member> {
  await deps.db.transaction(async (tx) => {
    const m = await repo.findMembershipForUpdate(tx, by.farmId, id);
    if (!m) throw notFound('That member');
    if (m.role === 'owner' && role !== 'owner') await keepAnOwner(tx, by.farmId, m.id);
    await repo.updateMembership(tx, m.id, { role });
  });
  return (await repo.getMember(deps.db, by.farmId, id))!;
}

export async function remove(deps: AppDeps, by: SessionPrincipal, id: number): Promise<void> {
  await deps.db.transaction(async (tx) => {
    const m = await repo.findMembershipForUpdate(tx, by.farmId, id);
    if (!m) throw notFound('That member');
    if (m.role === 'owner') await keepAnOwner(tx, by.farmId, m.id);
    await repo.updateMembership(tx, m.id, { status: 'removed', removed: true });
    await users.voidOpenTokens(tx, m.user_id, 'invite');
  });
}
