import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

const tokenIn = (text: string): string => {
  const m = /accept-invitation\?token=([A-Za-z0-9_-]+)/.exec(text);
  if (!m) throw new Error(`no invitation link in:\n${text}`);
  return m[1];
};

describe('members', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Members');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  it('when the owner lists members, then they see their own farm only', async () => {
    const elsewhere = await makeFarm(t.db, 'Neighbour');
    const res = await owner.get('/api/members');
    expect(res.status).toBe(200);
    const emails = res.body.map((m: { email: string }) => m.email).sort();
    expect(emails).toEqual([farm.operator.email, farm.owner.email, farm.viewer.email].sort());
    expect(emails).not.toContain(elsewhere.owner.email);
  });

  it('when the owner changes a role, then the member acts with the new role at once', async () => {
    const op = new Client(t.app);
    await op.signIn(farm.operator.email, farm.operator.password);
    const res = await owner.patch(`/api/members/${farm.operator.membershipId}`, { role: 'viewer' });
    expect(res.status).toBe(200);
    expect(res.body.role).toBe('viewer');
    expect((await op.get('/api/auth/me')).body.role).toBe('viewer');
    await owner.patch(`/api/members/${farm.operator.membershipId}`, { role: 'operator' });
  });

  it('when the only owner would be demoted or removed, then 409 and nothing changes', async () => {
    const demote = await owner.patch(`/api/members/${farm.owner.membershipId}`, { role: 'viewer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    const remove = await owner.delete(`/api/members/${farm.owner.membershipId}`);
    expect(remove.status).toBe(409);
    expect((await t.db('memberships').where({ id: farm.owner.membershipId }).first()).role).toBe('owner');
  });

  it('when a member is removed, then they are signed out and cannot sign in, but their user row stays', async () => {
    const extra = await makeFarm(t.db, 'Removal');
    const ownerX = new Client(t.app);
    await ownerX.signIn(extra.owner.email, extra.owner.password);
    const viewer = new Client(t.app);
    await viewer.signIn(extra.viewer.email, extra.viewer.password);
    expect((await ownerX.delete(`/api/members/${extra.viewer.membershipId}`)).status).toBe(204);
    expect((await viewer.get('/api/auth/me')).status).toBe(401);
    const again = new Client(t.app);
    await again.prime();
    const res = await again.post('/api/auth/login', { email: extra.viewer.email, password: extra.viewer.password });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('no_farm');
    expect(await t.db('users').where({ id: extra.viewer.id }).first()).toBeDefined();
    expect((await t.db('memberships').where({ id: extra.viewer.membershipId }).first()).status).toBe('removed');
    expect((await ownerX.get('/api/members')).body.map((m: { email: string }) => m.email)).not.toContain(extra.viewer.email);
  });

  it('when someone already on the farm is invited again, then 409', async () => {
    const res = await owner.post('/api/members/invite', { email: farm.viewer.email, name: 'Again', role: 'viewer' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already_member');
  });

  it('when the owner invites an address that already has an account, then the answer is the one a new address gets (the typed name), and the account is unchanged', async () => {
    const neighbour = await makeFarm(t.db, 'Neighbour account');
    const fresh = `fresh.${Date.now().toString(36)}@furlong.test`;
    const known = await owner.post('/api/members/invite', { email: neighbour.owner.email, name: 'Hired Hand', role: 'operator' });
    const unknown = await owner.post('/api/members/invite', { email: fresh, name: 'Hired Hand', role: 'operator' });
    expect(known.status).toBe(201);
    expect(unknown.status).toBe(known.status);
    const shape = (m: Record<string, unknown>) => ({ ...m, id: typeof m.id, email: typeof m.email, invitedAt: typeof m.invitedAt });
    expect(shape(known.body)).toEqual(shape(unknown.body));
    expect(known.body).toMatchObject({ name: 'Hired Hand', userId: null, status: 'invited', email: neighbour.owner.email });
    const listed = (await owner.get('/api/members')).body.find((m: { id: number }) => m.id === known.body.id);
    expect(listed.name).toBe('Hired Hand');
    expect(JSON.stringify((await owner.get('/api/members')).body)).not.toContain(neighbour.owner.name);
    expect((await t.db('users').where({ id: neighbour.owner.id }).first()).name).toBe(neighbour.owner.name);

    // Once the person accepts, the farm sees the name they go by.
    await t.flushMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(neighbour.owner.email) && m.text.includes('accept-invitation'));
    const guest = new Client(t.app);
    await guest.prime();
    const accepted = await guest.post('/api/auth/set-password', { token: tokenIn(mail.text), password: 'neighbour-new-password' });
    expect(accepted.status).toBe(200);
    const after = (await owner.get('/api/members')).body.find((m: { id: number }) => m.id === known.body.id);
    expect(after).toMatchObject({ name: neighbour.owner.name, status: 'active', userId: neighbour.owner.id });
  });
});
