// What the one error handler makes of real PostgreSQL failures: bad data is a 400 with a plain
// reason, a database that cannot be reached is the 503, and the log never holds the statement or
// the values sent with it.
import express from 'express';
import request from 'supertest';
import { createDb, type Db } from '../../server/db/knex';
import { DB_UNAVAILABLE_MESSAGE, errorHandler } from '../../server/http/errors';
import { faultCluster, freePort, isPostgresRunning, startPostgres } from './support/fault-cluster';

describe('database failures reaching the error handler', () => {
  const cluster = faultCluster();
  let db: Db;
  beforeAll(() => {
    if (!isPostgresRunning(cluster)) startPostgres(cluster);
    db = createDb(cluster.url, { min: 0, max: 2 });
  });
  afterAll(() => db.destroy());

  /** An app whose one route runs `query`, and what its error handler logged. */
  async function answer(query: (db: Db) => Promise<unknown>, on: Db = db) {
    const logged: unknown[] = [];
    const app = express();
    app.get('/api/try', async (_req, res) => {
      await query(on);
      res.json({ answered: true });
    });
    app.use(errorHandler((e) => logged.push(e)));
    const res = await request(app).get('/api/try');
    return { res, logged: JSON.stringify(logged) };
  }

  // SQLSTATEs from the PostgreSQL manual, Appendix A "PostgreSQL Error Codes".
  it.each([
    ['22P02 invalid_text_representation', (d: Db) => d('fields').where('id', 'not-a-number-SECRET').first()],
    ['22003 numeric_value_out_of_range', (d: Db) => d.raw('SELECT ?::integer AS n', ['99999999999'])],
    // mail_outbox.kind is varchar(20) (migrations/20261201000400_mail_outbox.ts).
    [
      '22001 string_data_right_truncation',
      (d: Db) => d('mail_outbox').insert({ kind: 'SECRET'.repeat(5), to_address: 'a@b.test', subject: 's', text_body: 't' }),
    ],
  ])('when PostgreSQL refuses a value (%s), then 400 with a plain reason', async (_name, query) => {
    const { res, logged } = await answer(query);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.message).toMatch(/nothing was changed/);
    expect(JSON.stringify(res.body)).not.toMatch(/SECRET|select/i);
    expect(logged).not.toMatch(/SECRET|select/i);
  });

  it('when a statement fails on the server side, then 500, and the log has its code and route but no SQL or values', async () => {
    const { res, logged } = await answer((d) => d('no_such_table').where({ secret: 'SECRET-VALUE' }).first());
    expect(res.status).toBe(500);
    expect(JSON.parse(logged)).toEqual([{ code: '42P01', message: 'relation "no_such_table" does not exist', route: 'GET /api/try' }]);
  });

  it('when nothing listens where the database should be, then 503 db_unavailable', async () => {
    const nowhere = createDb(`postgres://postgres:x@127.0.0.1:${await freePort()}/none`, { min: 0, max: 1 });
    try {
      const { res, logged } = await answer((d) => d('fields').where({ name: 'SECRET' }).first(), nowhere);
      expect(res.status).toBe(503);
      expect(res.body).toEqual({ error: { code: 'db_unavailable', message: DB_UNAVAILABLE_MESSAGE } });
      expect(logged).toMatch(/ECONNREFUSED/);
      expect(logged).not.toMatch(/SECRET|select/i);
    } finally {
      await nowhere.destroy();
    }
  });
});
