import request from 'supertest';
import { createApp } from '../../server/app';
import { createSessionStore } from '../../server/http/session';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, cookieValue, startTestApp, type TestApp } from '../support/test-app';

const linkIn = (text: string, path: string): string => {
  const m = text.match(new RegExp(`https?://\\S+${path}\\?token=([A-Za-z0-9_-]+)`));
  if (!m) throw new Error(`no ${path} link in:\n${text}`);
  return m[1];
};

/** Waits until an e-mail to `address` is in the outbox: /forgot does its work after answering. */
async function queuedFor(t: TestApp, address: string, after = 0): Promise<void> {
  const deadline = Date.now() + 10_000;
  const count = async () => Number((await t.db('mail_outbox').where({ to_address: address }).count({ n: '*' }))[0].n);
  while ((await count()) <= after) {
    if (Date.now() > deadline) throw new Error(`no e-mail to ${address} was queued`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}
const outboxCount = async (t: TestApp, address: string) =>
  Number((await t.db('mail_outbox').where({ to_address: address }).count({ n: '*' }))[0].n);

describe('sign-in and sessions', () => {
  let t: TestApp;
  let farm: TestFarm;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Auth');
  });
  afterAll(() => t.close());

  it('when an owner signs in, then the answer names the user, the farm and the role', async () => {
    const c = new Client(t.app);
    const res = await c.signIn(farm.owner.email.toUpperCase(), farm.owner.password);
    expect(res.body).toEqual({
      user: { id: farm.owner.id, email: farm.owner.email, name: farm.owner.name },
      farm: { id: farm.id, name: farm.name, units: 'us', timeZone: 'America/Chicago' },
      membershipId: farm.owner.membershipId,
      role: 'owner',
    });
    const me = await c.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.role).toBe('owner');
  });

  it('when the password is wrong, then 401 with a message and no session', async () => {
    const c = new Client(t.app);
    await c.prime();
    const res = await c.post('/api/auth/login', { email: farm.viewer.email, password: 'wrong-password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({
      code: 'bad_credentials',
      message: expect.stringMatching(/do not match/),
      requestId: res.headers['x-request-id'],
    });
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when an unknown address signs in, then the answer is the same as for a wrong password', async () => {
    const c = new Client(t.app);
    await c.prime();
    const res = await c.post('/api/auth/login', { email: 'nobody-here@furlong.test', password: 'whatever-it-is' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('bad_credentials');
  });

  it('when someone signs out, then the session no longer works', async () => {
    const c = new Client(t.app);
    await c.signIn(farm.operator.email, farm.operator.password);
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when the session cookie is set, then it is HttpOnly, SameSite=Lax and not Secure over plain http', async () => {
    const c = new Client(t.app);
    const res = await c.signIn(farm.viewer.email, farm.viewer.password);
    const sid = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((s) => s.startsWith('furlong.sid='));
    expect(sid).toMatch(/HttpOnly/i);
    expect(sid).toMatch(/SameSite=Lax/i);
    expect(sid).not.toMatch(/Secure/i);
  });

  it('when served over https, then the session cookie is Secure', async () => {
    const https = await startTestApp({ PUBLIC_URL: 'https://farm.example', TRUST_PROXY: '1' });
    try {
      // Over https the XSRF cookie is Secure too, so carry it by hand on this plain-http test client.
      const first = await request(https.app).get('/api/health').set('X-Forwarded-Proto', 'https');
      const xsrfCookie = ([] as string[]).concat(first.headers['set-cookie'] ?? []).find((s) => s.startsWith('XSRF-TOKEN='))!;
      expect(xsrfCookie).toMatch(/; Secure/i);
      const xsrf = cookieValue(xsrfCookie, 'XSRF-TOKEN')!;
      const res = await request(https.app)
        .post('/api/auth/login')
        .set('X-Forwarded-Proto', 'https')
        .set('Cookie', `XSRF-TOKEN=${encodeURIComponent(xsrf)}`)
        .set('X-XSRF-TOKEN', xsrf)
        .send({ email: farm.viewer.email, password: farm.viewer.password });
      expect(res.status).toBe(200);
      const sid = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((s) => s.startsWith('furlong.sid='));
      expect(sid).toMatch(/; Secure/i);
    } finally {
      await https.close();
    }
  });

  it('when a session id exists before sign-in, then sign-in issues a new one (no fixation)', async () => {
    const c = new Client(t.app);
    await c.signIn(farm.operator.email, farm.operator.password);
    const before = await c.post('/api/auth/logout');
    expect(before.status).toBe(204);
    // Plant a session id from an earlier sign-in, then sign in again through it.
    const first = await c.post('/api/auth/login', { email: farm.operator.email, password: farm.operator.password });
    const planted = cookieValue(first.headers['set-cookie'], 'furlong.sid');
    const again = await c.post('/api/auth/login', { email: farm.operator.email, password: farm.operator.password });
    const issued = cookieValue(again.headers['set-cookie'], 'furlong.sid');
    expect(planted).toBeDefined();
    expect(issued).toBeDefined();
    expect(issued).not.toEqual(planted);
    const oldSid = decodeURIComponent(planted!).slice(2).split('.')[0];
    expect(await t.db('session').where({ sid: oldSid }).first()).toBeUndefined();
  });

  it('when the server restarts, then a signed-in person stays signed in (sessions are in PostgreSQL)', async () => {
    const c = new Client(t.app);
    const login = await c.signIn(farm.owner.email, farm.owner.password);
    const sid = cookieValue(login.headers['set-cookie'], 'furlong.sid');
    const sessions = createSessionStore(t.config.databaseUrl, false);
    try {
      const restarted = createApp({ config: t.config, db: t.db, sessions, nudgeMail: () => undefined, log: () => undefined });
      const res = await request(restarted)
        .get('/api/auth/me')
        .set('Cookie', `furlong.sid=${encodeURIComponent(sid!)}`);
      expect(res.status).toBe(200);
      expect(res.body.user.email).toBe(farm.owner.email);
    } finally {
      await sessions.close();
    }
  });

  it('when a state-changing request lacks the XSRF header, then 403 and nothing happens', async () => {
    const c = new Client(t.app);
    await c.prime();
    const res = await c.agent.post('/api/auth/login').send({ email: farm.owner.email, password: farm.owner.password });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
    const forged = await c.agent
      .post('/api/auth/login')
      .set('X-XSRF-TOKEN', 'abc.def')
      .send({ email: farm.owner.email, password: farm.owner.password });
    expect(forged.status).toBe(403);
  });

  it('when a token made for one session is sent with another session, then 403 csrf (the token is bound to the session)', async () => {
    const a = new Client(t.app);
    await a.signIn(farm.owner.email, farm.owner.password);
    const b = new Client(t.app);
    const sidB = cookieValue((await b.signIn(farm.viewer.email, farm.viewer.password)).headers['set-cookie'], 'furlong.sid')!;
    expect(a.xsrf).not.toBe(b.xsrf);
    // B's session cookie, with A's token as both the XSRF cookie and the header (a token A could give away).
    const res = await request(t.app)
      .post('/api/auth/logout')
      .set('Cookie', `furlong.sid=${encodeURIComponent(sidB)}; XSRF-TOKEN=${encodeURIComponent(a.xsrf)}`)
      .set('X-XSRF-TOKEN', a.xsrf);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf');
    expect((await b.get('/api/auth/me')).status).toBe(200);
    // With its own token, B's session works.
    expect((await b.post('/api/auth/logout')).status).toBe(204);
  });

  it('when someone signs in, then the answer carries a new token for the new session, and the one from before sign-in no longer works', async () => {
    const c = new Client(t.app);
    await c.prime();
    const anonymous = c.xsrf;
    const login = await c.signIn(farm.operator.email, farm.operator.password);
    expect(cookieValue(login.headers['set-cookie'], 'XSRF-TOKEN')).toBe(c.xsrf);
    expect(c.xsrf).not.toBe(anonymous);
    const stale = await c.agent
      .post('/api/auth/logout')
      .set('Cookie', `XSRF-TOKEN=${encodeURIComponent(anonymous)}`)
      .set('X-XSRF-TOKEN', anonymous);
    expect(stale.status).toBe(403);
    const out = await c.post('/api/auth/logout');
    expect(out.status).toBe(204);
    // Sign-out hands back an anonymous token, good for signing in again at once.
    expect(cookieValue(out.headers['set-cookie'], 'XSRF-TOKEN')).toBe(c.xsrf);
    expect((await c.post('/api/auth/login', { email: farm.operator.email, password: farm.operator.password })).status).toBe(200);
  });

  it('when an account has 5 failed sign-ins, then the next attempt is refused with 429 even with the right password', async () => {
    const victim = await makeFarm(t.db, 'Limit');
    const c = new Client(t.app);
    await c.prime();
    for (let i = 0; i < 5; i++) {
      expect((await c.post('/api/auth/login', { email: victim.owner.email, password: `wrong-${i}` })).status).toBe(401);
    }
    const res = await c.post('/api/auth/login', { email: victim.owner.email, password: victim.owner.password });
    expect(res.status).toBe(429);
    expect(res.body.error.message).toMatch(/Too many failed sign-ins for this account/);
    // Another account from the same address is still allowed (limit is per account).
    expect((await c.post('/api/auth/login', { email: victim.viewer.email, password: victim.viewer.password })).status).toBe(200);
  });

  it('when a stranger fails 5 times from one address, then the owner still signs in from another, and the stranger stays limited', async () => {
    const proxied = await startTestApp({ TRUST_PROXY: '1' });
    try {
      const victim = await makeFarm(proxied.db, 'Lockout');
      const stranger = new Client(proxied.app);
      await stranger.prime();
      const from = (c: Client, ip: string, password: string) =>
        c.post('/api/auth/login', { email: victim.owner.email, password }).set('X-Forwarded-For', ip);
      for (let i = 0; i < 5; i++) expect((await from(stranger, '203.0.113.7', `wrong-${i}`)).status).toBe(401);
      const limited = await from(stranger, '203.0.113.7', victim.owner.password);
      expect(limited.status).toBe(429);
      expect(limited.body.error.message).toMatch(/for this account/);
      const owner = new Client(proxied.app);
      await owner.prime();
      expect((await from(owner, '198.51.100.20', victim.owner.password)).status).toBe(200);
    } finally {
      await proxied.close();
    }
  });

  it('when one address fails 30 times across accounts, then it is refused with 429', async () => {
    const attacker = await startTestApp();
    try {
      const c = new Client(attacker.app);
      await c.prime();
      for (let i = 0; i < 30; i++) await c.post('/api/auth/login', { email: `guess-${i}@furlong.test`, password: 'guess-guess' });
      const res = await c.post('/api/auth/login', { email: farm.owner.email, password: farm.owner.password });
      expect(res.status).toBe(429);
      expect(res.body.error.message).toMatch(/from this address/);
    } finally {
      await attacker.close();
    }
  });
});

describe('security headers', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('when any page is served, then the CSP allows only the app itself', async () => {
    const res = await new Client(t.app).get('/fields');
    const csp = res.headers['content-security-policy'];
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).toMatch(/style-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
    expect(csp).toMatch(/font-src 'self'/);
    expect(csp).toMatch(/connect-src 'self'/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    expect(csp).not.toMatch(/https:|http:|\*/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('when the API answers, then its CSP allows nothing (data is never a page) and two pages get different nonces', async () => {
    const api = await new Client(t.app).get('/api/health');
    expect(api.headers['content-security-policy']).toBe("default-src 'none';frame-ancestors 'none'");
    expect(api.headers['x-content-type-options']).toBe('nosniff');
    const nonce = async () => /'nonce-([^']+)'/.exec((await new Client(t.app).get('/')).headers['content-security-policy'])?.[1];
    const [a, b] = [await nonce(), await nonce()];
    expect(a).toMatch(/^[A-Za-z0-9+/=]{24}$/);
    expect(b).not.toBe(a);
  });

  it('when the XSRF cookie is set, then the page script can read it (Angular sends it back)', async () => {
    const res = await new Client(t.app).get('/api/health');
    const x = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((s) => s.startsWith('XSRF-TOKEN='));
    expect(x).toMatch(/SameSite=Lax/i);
    expect(x).not.toMatch(/HttpOnly/i);
  });
});

describe('invitations and password resets by e-mail', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Invite');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  it('when the owner invites someone, then the e-mailed link lets them set a password and sign in with the role given', async () => {
    const tag = Date.now().toString(36);
    const address = `new.hand.${tag}@furlong.test`;
    const res = await owner.post('/api/members/invite', { email: `New.Hand.${tag}@Furlong.test`, name: 'New Hand', role: 'operator' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: address, role: 'operator', status: 'invited' });
    await t.flushMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(address));
    expect(mail.subject).toContain(farm.name);
    expect(mail.html).toContain('accept-invitation?token=');
    const token = linkIn(mail.text, '/accept-invitation');

    const guest = new Client(t.app);
    await guest.prime();
    const info = await guest.get(`/api/auth/token/${token}`);
    expect(info.body).toEqual({ kind: 'invite', email: address, name: 'New Hand', farmName: farm.name });
    const set = await guest.post('/api/auth/set-password', { token, password: 'a-fine-new-password', name: 'Newton Hand' });
    expect(set.status).toBe(200);
    expect(set.body).toMatchObject({ role: 'operator', user: { name: 'Newton Hand' }, farm: { id: farm.id } });

    const again = new Client(t.app);
    expect((await again.signIn(address, 'a-fine-new-password')).body.role).toBe('operator');
    // The link works once.
    const reuse = await guest.post('/api/auth/set-password', { token, password: 'another-password-1' });
    expect(reuse.status).toBe(410);
    expect(reuse.body.error.code).toBe('token_used');
  });

  it('when an invitation link has expired, then it is refused and no password is set', async () => {
    const late = `late.${Date.now().toString(36)}@furlong.test`;
    await owner.post('/api/members/invite', { email: late, name: 'Late Comer', role: 'viewer' });
    await t.flushMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(late));
    const token = linkIn(mail.text, '/accept-invitation');
    await t
      .db('auth_tokens')
      .whereIn('user_id', t.db('users').select('id').where({ email: late }))
      .update({ expires_at: new Date(Date.now() - 1000) });
    const guest = new Client(t.app);
    await guest.prime();
    const res = await guest.post('/api/auth/set-password', { token, password: 'a-fine-new-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('token_expired');
    const user = await t.db('users').where({ email: late }).first();
    expect(user.password_hash).toBeNull();
  });

  it('when someone asks for a reset, then the e-mailed link sets a new password and the old one stops working', async () => {
    const guest = new Client(t.app);
    await guest.prime();
    const res = await guest.post('/api/auth/forgot', { email: farm.viewer.email });
    expect(res.status).toBe(202);
    await queuedFor(t, farm.viewer.email);
    await t.flushMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(farm.viewer.email));
    const token = linkIn(mail.text, '/set-password');
    const set = await guest.post('/api/auth/set-password', { token, password: 'brand-new-password' });
    expect(set.status).toBe(200);
    expect(set.body.role).toBe('viewer');
    const old = new Client(t.app);
    await old.prime();
    expect((await old.post('/api/auth/login', { email: farm.viewer.email, password: farm.viewer.password })).status).toBe(401);
    expect((await old.post('/api/auth/login', { email: farm.viewer.email, password: 'brand-new-password' })).status).toBe(200);
  });

  it('when a reset is asked for an unknown address, then the answer is the same and no mail is sent', async () => {
    const guest = new Client(t.app);
    await guest.prime();
    const before = t.mail.messages.length;
    const queued = await outboxCount(t, farm.operator.email);
    const unknown = await guest.post('/api/auth/forgot', { email: 'stranger@furlong.test' });
    const known = await guest.post('/api/auth/forgot', { email: farm.operator.email });
    expect(unknown.status).toBe(known.status);
    expect(unknown.body).toEqual(known.body);
    // The unknown address was asked first; its look-up is done by the time the known one is queued.
    await queuedFor(t, farm.operator.email, queued);
    expect(await outboxCount(t, 'stranger@furlong.test')).toBe(0);
    await t.flushMail();
    await t.mail.waitFor((m) => m.to.includes(farm.operator.email));
    expect(t.mail.messages.slice(before).some((m) => m.to.includes('stranger@furlong.test'))).toBe(false);
  });

  it('when a second reset is asked, then the first link no longer works', async () => {
    const guest = new Client(t.app);
    await guest.prime();
    const queued = await outboxCount(t, farm.owner.email);
    await guest.post('/api/auth/forgot', { email: farm.owner.email });
    await queuedFor(t, farm.owner.email, queued);
    await t.flushMail();
    const first = linkIn(
      (await t.mail.waitFor((m) => m.to.includes(farm.owner.email) && m.subject.includes('password'))).text,
      '/set-password',
    );
    const count = t.mail.to(farm.owner.email).length;
    await guest.post('/api/auth/forgot', { email: farm.owner.email });
    await queuedFor(t, farm.owner.email, queued + 1);
    await t.flushMail();
    await t.mail.waitFor(() => t.mail.to(farm.owner.email).length > count);
    const res = await guest.post('/api/auth/set-password', { token: first, password: 'should-not-work' });
    expect(res.status).toBe(410);
  });
});

// Its own app: the mail links count against the per-address limit of the other block.
describe('a new password', () => {
  let t: TestApp;
  let farm: TestFarm;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Reset');
  });
  afterAll(() => t.close());

  it('when a password is reset, then every session signed in before it stops working, and the new one works', async () => {
    const phone = new Client(t.app);
    await phone.signIn(farm.operator.email, farm.operator.password);
    const office = new Client(t.app);
    await office.signIn(farm.operator.email, farm.operator.password);
    expect((await phone.get('/api/auth/me')).status).toBe(200);
    expect((await office.get('/api/auth/me')).status).toBe(200);
    const sessionsOf = async () =>
      (
        await t
          .db('session')
          .whereRaw(`(sess->'passport'->'user'->>'userId')::int = ?`, [farm.operator.id])
          .count<Array<{ count: number }>>('* as count')
      )[0].count;
    expect(await sessionsOf()).toBeGreaterThanOrEqual(2);

    const guest = new Client(t.app);
    await guest.prime();
    expect((await guest.post('/api/auth/forgot', { email: farm.operator.email })).status).toBe(202);
    await queuedFor(t, farm.operator.email);
    await t.flushMail();
    const mail = await t.mail.waitFor((m) => m.to.includes(farm.operator.email) && m.text.includes('/set-password'));
    const set = await guest.post('/api/auth/set-password', {
      token: linkIn(mail.text, '/set-password'),
      password: 'operator-new-password',
    });
    expect(set.status).toBe(200);

    // At once, though this server had just read those sessions (it keeps them a few seconds).
    expect((await phone.get('/api/auth/me')).status).toBe(401);
    expect((await office.get('/api/board?date=2026-05-04')).status).toBe(401);
    expect((await guest.get('/api/auth/me')).status).toBe(200);
    expect(await sessionsOf()).toBe(1);
  });
});

// Its own app too, for the same reason.
describe('a reset asked for while the database is slow', () => {
  let t: TestApp;
  let farm: TestFarm;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Slow');
  });
  afterAll(() => t.close());

  it('when the database is slow to find an address, then /forgot answers anyway (the look-up and the mail come after the answer)', async () => {
    // Holding a lock on users stops any look-up; an answer that waited for one would not come.
    const guest = new Client(t.app);
    await guest.prime();
    const queued = await outboxCount(t, farm.owner.email);
    const locker = await t.db.client.acquireConnection();
    try {
      await t.db.raw('BEGIN; LOCK TABLE users IN ACCESS EXCLUSIVE MODE').connection(locker);
      const answer = guest.post('/api/auth/forgot', { email: farm.owner.email }).then((res) => res);
      const first = await Promise.race([answer, new Promise<'blocked'>((resolve) => setTimeout(() => resolve('blocked'), 5_000))]);
      expect(first).not.toBe('blocked');
      expect((first as request.Response).status).toBe(202);
      expect(await outboxCount(t, farm.owner.email)).toBe(queued);
    } finally {
      await t.db.raw('ROLLBACK').connection(locker);
      await t.db.client.releaseConnection(locker);
    }
    // Once the database answers, the mail is queued all the same.
    await queuedFor(t, farm.owner.email, queued);
    expect(t.logged).toEqual([]);
  });
});

describe('a configured map background', () => {
  it('when a tile URL is set, then the CSP lets images (only) come from its origin', async () => {
    const t = await startTestApp({ MAP_TILE_URL: 'https://{s}.tiles.farm.example/{z}/{x}/{y}.png', MAP_TILE_ATTRIBUTION: 'Our own tiles' });
    try {
      const res = await new Client(t.app).get('/api/config');
      expect(res.body).toEqual({ mapTileUrl: 'https://{s}.tiles.farm.example/{z}/{x}/{y}.png', mapTileAttribution: 'Our own tiles' });
      const csp = (await new Client(t.app).get('/fields/12')).headers['content-security-policy'];
      expect(csp).toMatch(/img-src 'self' data: blob: https:\/\/\*\.tiles\.farm\.example;/);
      expect(csp).toMatch(/connect-src 'self';/);
      expect(csp).toMatch(/script-src 'self';/);
    } finally {
      await t.close();
    }
  });
});
