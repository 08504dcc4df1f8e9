// Private answers are not cached, and the demo accounts' passwords are hashed at the app's cost.
import bcrypt from 'bcryptjs';
import { BCRYPT_ROUNDS } from '../../server/auth/passwords';
import { demoAccounts, seed } from '../../seeds/01_demo_farm';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('API answers are never stored by a cache', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'No store');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  // RFC 9111 section 5.2.2.5: no-store keeps the answer out of every cache, private or shared.
  it.each(['/api/fields', '/api/board?date=2026-05-04', '/api/auth/me', '/api/members', '/api/health', '/api/no-such-thing'])(
    'when %s is read, then the answer says Cache-Control: no-store',
    async (path) => {
      const res = await owner.get(path);
      expect(res.headers['cache-control']).toBe('no-store');
    },
  );

  it('when a failed sign-in answers, then it is not stored either', async () => {
    const c = new Client(t.app);
    await c.prime();
    const res = await c.post('/api/auth/login', { email: farm.owner.email, password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('when the board is read again with its ETag, then 304 still comes, also marked no-store', async () => {
    const first = await owner.get('/api/board?date=2026-05-04');
    expect(first.headers.etag).toBeDefined();
    const again = await owner.get('/api/board?date=2026-05-04').set('If-None-Match', first.headers.etag);
    expect(again.status).toBe(304);
    expect(again.headers['cache-control']).toBe('no-store');
  });
});

describe('the demo accounts', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(() => t.close());

  it('when the demo farm is seeded, then every demo password is hashed at the cost the app uses (so a wrong one takes as long as an unknown address)', async () => {
    const rollback = new Error('rolled back on purpose');
    await expect(
      t.db.transaction(async (tx) => {
        await seed(tx, { reset: true });
        const rows: Array<{ email: string; password_hash: string }> = await tx('users')
          .whereIn(
            'email',
            demoAccounts.map((a) => a.email),
          )
          .select('email', 'password_hash');
        expect(rows).toHaveLength(demoAccounts.length);
        for (const a of demoAccounts) {
          const hash = rows.find((r) => r.email === a.email)!.password_hash;
          expect(bcrypt.getRounds(hash)).toBe(BCRYPT_ROUNDS);
          expect(await bcrypt.compare(a.password, hash)).toBe(true);
        }
        throw rollback;
      }),
    ).rejects.toBe(rollback);
  });
});
