// Sign-in, password resets and invitation links. Every answer that a stranger can get is the
// same whether or not an address is known, so the API does not reveal who uses Furlong.
import bcrypt from 'bcryptjs';
import type { Me, TokenInfo } from '../../shared/schemas/auth';
import type { AppDeps } from '../app-deps';
import { AppError } from '../http/errors';
import type { SessionPrincipal } from '../http/session-user';
import { enqueueMail } from '../mail/outbox.repository';
import { resetMail } from './auth.messages';
import { BCRYPT_ROUNDS, hashPassword } from './passwords';
import { RESET_MINUTES, hashToken, newToken } from './tokens';
import * as users from './users.repository';

export { BCRYPT_ROUNDS, hashPassword };
/** Compared against when an address has no password, so such a sign-in takes as long as any. */
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', BCRYPT_ROUNDS);

export function toMe(p: SessionPrincipal): Me {
  return {
    user: { id: p.id, email: p.email, name: p.name },
    farm: { id: p.farmId, name: p.farmName, units: p.units, timeZone: p.timeZone },
    role: p.role,
    membershipId: p.membershipId,
  };
}

const badCredentials = () => new AppError(401, 'bad_credentials', 'That e-mail and password do not match an account');

export async function verifyLogin(deps: AppDeps, email: string, password: string): Promise<SessionPrincipal> {
  const user = await users.findUserByEmail(deps.db, email);
  const ok = await bcrypt.compare(password, user?.password_hash ?? DUMMY_HASH);
  if (!user || !user.password_hash || !ok) throw badCredentials();
  const membership = await users.firstActiveMembership(deps.db, user.id);
  const principal = membership && (await users.loadPrincipal(deps.db, user.id, membership.id));
  if (!principal)
    throw new AppError(
      403,
      'no_farm',
      'Your account is not a member of any farm on Furlong any more; ask the farm owner to invite you again',
    );
  return principal;
}

export async function requestReset(deps: AppDeps, email: string): Promise<void> {
  const user = await users.findUserByEmail(deps.db, email);
  if (!user) return;
  await deps.db.transaction(async (tx) => {
    const membership = await users.firstActiveMembership(tx, user.id);
    if (!membership) return;
    await users.voidOpenTokens(tx, user.id, 'reset');
    const token = newToken();
    await users.insertToken(tx, {
      userId: user.id,
      farmId: null,
      kind: 'reset',
      hash: token.hash,
      expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000),
    });
    const link = `${deps.config.publicUrl}/set-password?token=${token.raw}`;
    await enqueueMail(tx, resetMail({ to: user.email, name: user.name, link, minutes: RESET_MINUTES }));
  });
  deps.nudgeMail();
}

function checkUsable(token: { used_at: Date | null; expires_at: Date } | undefined): asserts token {
  if (!token) throw new AppError(404, 'token_unknown', 'This link is not valid; ask for a new one');
  if (token.used_at) throw new AppError(410, 'token_used', 'This link was already used; ask for a new one');
  if (token.expires_at.getTime() < Date.now()) throw new AppError(410, 'token_expired', 'This link has expired; ask for a new one');
}

export async function tokenInfo(deps: AppDeps, raw: string): Promise<TokenInfo> {
  const token = await users.findToken(deps.db, hashToken(raw));
  checkUsable(token);
  const user = await users.findUserById(deps.db, token.user_id);
  const farmName = token.farm_id ? await users.farmName(deps.db, token.farm_id) : null;
  return { kind: token.kind, email: user!.email, name: user!.name, farmName };
}

/** Uses an invitation or reset link: sets the password, activates an invitation, signs in. */
export async function setPasswordWithToken(deps: AppDeps, raw: string, password: string, name?: string): Promise<SessionPrincipal> {
  const hash = await hashPassword(password);
  return deps.db.transaction(async (tx) => {
    const token = await users.findTokenForUpdate(tx, hashToken(raw));
    checkUsable(token);
    await users.markTokenUsed(tx, token.id);
    await users.setPasswordHash(tx, token.user_id, hash, token.kind === 'invite' ? name : undefined);
    let membershipId: number | undefined;
    if (token.kind === 'invite' && token.farm_id) {
      const m = await users.findOpenMembership(tx, token.user_id, token.farm_id);
      if (!m) throw new AppError(410, 'token_used', 'This invitation was withdrawn by the farm owner');
      await users.activateMembership(tx, m.id);
      membershipId = m.id;
    } else {
      membershipId = (await users.firstActiveMembership(tx, token.user_id))?.id;
    }
    const principal = membershipId && (await users.loadPrincipal(tx, token.user_id, membershipId));
    if (!principal) throw new AppError(403, 'no_farm', 'Your account is not a member of any farm on Furlong any more');
    return principal;
  });
}
