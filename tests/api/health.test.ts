import request from 'supertest';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { createSessionStore } from '../../server/http/session';
import { startTestApp, TEST_SECRET } from '../support/test-app';

describe('GET /api/health', () => {
  it('when the database answers, then 200 {status: ok, db: ok}', async () => {
    const t = await startTestApp();
    try {
      const res = await request(t.app).get('/api/health');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ status: 'ok', db: 'ok' });
    } finally {
      await t.close();
    }
  });

  it('when the database is unreachable, then 503 with db: down', async () => {
    // Port 9 (discard) on loopback has no PostgreSQL: the connection is refused.
    const url = 'postgres://postgres:x@127.0.0.1:9/none';
    const config = loadConfig({ NODE_ENV: 'test', DATABASE_URL: url, SESSION_SECRET: TEST_SECRET });
    const db = createDb(url);
    const sessions = createSessionStore(url, false);
    try {
      const app = createApp({ config, db, sessions, nudgeMail: () => undefined, log: () => undefined });
      const res = await request(app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body.db).toBe('down');
    } finally {
      await sessions.close().catch(() => undefined);
      await db.destroy();
    }
  });
});

describe('configuration', () => {
  it('when production starts without a session secret, then it refuses with a clear message', () => {
    expect(() => loadConfig({ NODE_ENV: 'production', DATABASE_URL: 'postgres://a@127.0.0.1/b', SMTP_URL: 'smtp://127.0.0.1:25' })).toThrow(
      /SESSION_SECRET is required in production/,
    );
  });
  it('when the session secret is short, then it refuses', () => {
    expect(() => loadConfig({ DATABASE_URL: 'postgres://a@127.0.0.1/b', SESSION_SECRET: 'short' })).toThrow(/at least 32 characters/);
  });
  it('when the database URL is missing, then it says so', () => {
    expect(() => loadConfig({ SESSION_SECRET: TEST_SECRET })).toThrow(/DATABASE_URL/);
  });
});
