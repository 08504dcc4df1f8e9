// PostgreSQL restarted under signed-in traffic: the real server process keeps running, answers
// 503 db_unavailable while the database is away, serves again once it is back (no restart), and
// a multi-row write is all or nothing.
import { createDb, type Db } from '../../server/db/knex';
import { DB_UNAVAILABLE_MESSAGE } from '../../server/http/errors';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { TEST_SECRET } from '../support/test-app';
import { faultCluster, HttpClient, isPostgresRunning, ServerProcess, sleep, startPostgres, stopPostgres } from './support/fault-cluster';

describe('PostgreSQL restarted while people are signed in', () => {
  const cluster = faultCluster();
  let db: Db;
  let farm: TestFarm;
  let server: ServerProcess;

  beforeAll(async () => {
    if (!isPostgresRunning(cluster)) startPostgres(cluster);
    db = createDb(cluster.url, { min: 0, max: 2 });
    farm = await makeFarm(db, 'Fault');
    server = await ServerProcess.start(cluster.url, TEST_SECRET);
  });

  afterAll(async () => {
    if (!isPostgresRunning(cluster)) startPostgres(cluster);
    await server?.stop();
    await db?.destroy();
  });

  it('when the database stops and starts again, then the server stays up, answers 503 db_unavailable meanwhile, serves again without a restart, and no invitation is half saved', async () => {
    const clients = await Promise.all(
      [0, 1, 2].map(async () => {
        const c = new HttpClient(server.base);
        await c.signIn(farm.owner.email, farm.owner.password);
        return c;
      }),
    );
    const seen: Array<{ phase: string; status: number; code?: string; message?: string }> = [];
    const attempts: Array<{ email: string; status: number }> = [];
    const tag = Date.now().toString(36);
    let phase = 'before';
    let running = true;
    let k = 0;
    const levels = ['qualified', 'learning', 'mentor', 'none'] as const;
    const record = (r: { status: number; body: unknown }) => {
      const error = (r.body as { error?: { code: string; message: string } } | null)?.error;
      seen.push({ phase, status: r.status, code: error?.code, message: error?.message });
    };
    const failed = () => ({ status: 0, body: null });
    // Client 0 invites people: one transaction writes a user, a membership, a sign-in token and
    // the invitation e-mail. The others save crew skills. All read the member list.
    const traffic = clients.map(async (c, i) => {
      while (running) {
        if (i === 0) {
          const email = `fault.${tag}.${k++}@furlong.test`;
          const write = await c.request('POST', '/api/members/invite', { email, name: 'Fault Hand', role: 'operator' }).catch(failed);
          attempts.push({ email, status: write.status });
          record(write);
        } else {
          const level = levels[k++ % levels.length];
          record(await c.request('PUT', `/api/crew/${farm.operator.membershipId}/skills/seeding`, { level }).catch(failed));
        }
        record(await c.request('GET', '/api/members').catch(failed));
        await sleep(50);
      }
    });

    // Signed-in requests have just used every pool; the original crash came within seconds of one.
    await sleep(1500);
    phase = 'outage';
    stopPostgres(cluster);
    await sleep(4000);
    expect(server.exit).toBeNull();
    phase = 'recovering';
    startPostgres(cluster);
    // The first requests after the start may still meet connections the restart ended.
    await sleep(3000);
    phase = 'after';
    await sleep(2000);
    running = false;
    await Promise.all(traffic);

    expect(server.exit).toBeNull();
    const during = seen.filter((s) => s.phase === 'outage');
    expect(during.length).toBeGreaterThan(0);
    expect(during.some((s) => s.status === 503)).toBe(true);
    // During the outage every answer is either a success that got in first or the clear 503.
    for (const s of during.filter((x) => x.status !== 200 && x.status !== 201)) {
      expect(s).toMatchObject({ status: 503, code: 'db_unavailable', message: DB_UNAVAILABLE_MESSAGE });
    }
    // Nothing anywhere was a 500, a sign-out or a dropped connection.
    expect(seen.filter((s) => ![200, 201, 503].includes(s.status))).toEqual([]);
    const after = seen.filter((s) => s.phase === 'after');
    expect(after.length).toBeGreaterThan(0);
    expect(after.every((s) => s.status === 200 || s.status === 201)).toBe(true);

    // Each invitation is all four rows or none; every 201 has all four.
    expect(attempts.filter((a) => a.status === 503).length).toBeGreaterThan(0);
    expect(attempts.filter((a) => a.status === 201).length).toBeGreaterThan(0);
    for (const a of attempts) {
      const user = await db('users').where({ email: a.email }).first();
      const rows = user
        ? [
            await db('memberships').where({ user_id: user.id, farm_id: farm.id }).count({ n: '*' }),
            await db('auth_tokens').where({ user_id: user.id, kind: 'invite' }).count({ n: '*' }),
            await db('mail_outbox').where({ to_address: a.email, kind: 'invite' }).count({ n: '*' }),
          ].map((r) => Number(r[0].n))
        : [0, 0, 0];
      expect({ ...a, rows: [user ? 1 : 0, ...rows] }).toEqual({ ...a, rows: a.status === 201 || user ? [1, 1, 1, 1] : [0, 0, 0, 0] });
    }

    // The health check said so too, and the log holds no SQL.
    expect((await clients[0].request('GET', '/api/health')).status).toBe(200);
    expect(server.output).not.toMatch(/\binsert into\b|\bselect\b.*\bfrom\b/i);
    expect(server.output).not.toMatch(/Unhandled 'error' event|Called end on pool/);
  });

  it('when the database is down, then /api/health answers 503 and, once it is back, 200 (same process)', async () => {
    const anonymous = new HttpClient(server.base);
    expect((await anonymous.request('GET', '/api/health')).status).toBe(200);
    stopPostgres(cluster);
    try {
      const down = await anonymous.request('GET', '/api/health');
      expect(down).toEqual({ status: 503, body: { status: 'degraded', db: 'down' } });
    } finally {
      startPostgres(cluster);
    }
    let up = { status: 0, body: null as unknown };
    for (let i = 0; i < 40 && up.status !== 200; i++) {
      up = await anonymous.request('GET', '/api/health');
      if (up.status !== 200) await sleep(250);
    }
    expect(up).toEqual({ status: 200, body: { status: 'ok', db: 'ok' } });
    expect(server.exit).toBeNull();
  });
});
