// The work board is served from memory while the farm's data revision stays the same. These tests
// change the data every way it can change (the API, plain SQL as a seed or another process would,
// a rolled-back transaction) and check that the board follows, that conditional and compressed
// answers carry the same board, and that sign-in checks still run on every request.
import request from 'supertest';
import type { Board } from '../../shared/schemas/board';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

const DAY = '2026-05-04';

describe('the board cache and the farm revision', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let fieldId: number;

  const revision = async (farmId: number): Promise<string> =>
    String((await t.db('farm_revisions').where({ farm_id: farmId }).first('revision'))?.revision ?? 'none');
  const boardRes = () => owner.get(`/api/board?date=${DAY}`);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Cache');
    other = await makeFarm(t.db, 'Cache other');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    const [f] = await t
      .db('fields')
      .insert({
        farm_id: farm.id,
        name: 'Coulee quarter',
        boundary: JSON.stringify(rect(-99.5, 47.2, 0.01, 0.01)),
        area_m2: 160 * 4046.8564224,
        acres: 160,
      })
      .returning('id');
    fieldId = f.id;
    const machine = await insertMachine(t.db, farm.id, { power_hp: 450 });
    const implement = await insertImplement(t.db, farm.id, { width_m: 18.288 });
    const { version } = (await boardRes()).body as Board;
    const created = await owner.post('/api/assignments', {
      version,
      date: DAY,
      operation: 'harrowing',
      fieldId,
      operatorId: farm.operator.membershipId,
      machineId: machine,
      implementId: implement,
    });
    expect(created.status).toBe(201);
  });
  afterAll(() => t.close());

  describe('the farm revision', () => {
    it('when a farm is created, then it has a revision', async () => {
      expect(await revision(farm.id)).toMatch(/^\d+$/);
    });

    it("when one farm's data changes, then its revision changes and another farm's does not", async () => {
      const [before, otherBefore] = [await revision(farm.id), await revision(other.id)];
      await t.db.transaction(async (tx) => {
        await tx('fields').where({ id: fieldId }).update({ name: 'Coulee quarter' });
        await tx('crop_plans').insert({ farm_id: farm.id, field_id: fieldId, season: 2026, crop: 'durum' });
      });
      const after = await revision(farm.id);
      expect(after).not.toBe(before);
      expect(BigInt(after) > BigInt(before)).toBe(true);
      expect(await revision(other.id)).toBe(otherBefore);
    });

    it('when a transaction is rolled back, then the revision stays', async () => {
      const before = await revision(farm.id);
      await expect(
        t.db.transaction(async (tx) => {
          await tx('fields').where({ id: fieldId }).update({ name: 'Never saved' });
          throw new Error('changed my mind');
        }),
      ).rejects.toThrow('changed my mind');
      expect(await revision(farm.id)).toBe(before);
    });

    it("when a person's name changes, then every farm they belong to gets a new revision", async () => {
      const [u] = await t
        .db('users')
        .insert({ email: `both-${farm.id}@furlong.test`, name: 'Both Farms' })
        .returning('id');
      await t.db('memberships').insert([
        { farm_id: farm.id, user_id: u.id, role: 'viewer', status: 'active' },
        { farm_id: other.id, user_id: u.id, role: 'viewer', status: 'active' },
      ]);
      const [a, b] = [await revision(farm.id), await revision(other.id)];
      await t.db('users').where({ id: u.id }).update({ name: 'Both Farms Renamed' });
      expect(await revision(farm.id)).not.toBe(a);
      expect(await revision(other.id)).not.toBe(b);
    });

    it('when a farm is deleted with all its data, then the commit goes through and its revision goes with it', async () => {
      const gone = await makeFarm(t.db, 'Gone');
      await t
        .db('fields')
        .insert({ farm_id: gone.id, name: 'Gone field', boundary: JSON.stringify(rect(-99, 47, 0.01, 0.01)), area_m2: 4046.86, acres: 1 });
      await t.db.transaction(async (tx) => {
        await tx('memberships').where({ farm_id: gone.id }).delete();
        await tx('farms').where({ id: gone.id }).delete();
      });
      expect(await t.db('farm_revisions').where({ farm_id: gone.id }).first()).toBeUndefined();
    });
  });

  describe('reading the board', () => {
    it('when nothing changes, then two reads carry the same ETag and a conditional read gets 304 with no body', async () => {
      const first = await boardRes();
      const second = await boardRes();
      expect(first.status).toBe(200);
      expect(second.headers.etag).toBe(first.headers.etag);
      expect(second.body).toEqual(first.body);
      const again = await owner.get(`/api/board?date=${DAY}`).set('If-None-Match', first.headers.etag);
      expect(again.status).toBe(304);
      expect(again.text).toBe('');
    });

    it('when data changes outside the API (plain SQL), then the next read shows it under a new ETag', async () => {
      const before = await boardRes();
      await t.db('fields').where({ id: fieldId }).update({ name: 'Renamed by hand' });
      await t.db('farms').where({ id: farm.id }).update({ day_hours_limit: 9 });
      const after = await boardRes();
      expect(after.headers.etag).not.toBe(before.headers.etag);
      const b = after.body as Board;
      expect(b.assignments[0].field.name).toBe('Renamed by hand');
      expect(b.dayHoursLimit).toBe(9);
      const stale = await owner.get(`/api/board?date=${DAY}`).set('If-None-Match', before.headers.etag);
      expect(stale.status).toBe(200);
    });

    it('when data changes through the API, then the next read shows it', async () => {
      const b = (await boardRes()).body as Board;
      const moved = await owner.patch(`/api/assignments/${b.assignments[0].id}`, { version: b.version, note: 'Rocks on the east side' });
      expect(moved.status).toBe(200);
      expect(((await boardRes()).body as Board).assignments[0].note).toBe('Rocks on the east side');
    });

    it('when twenty reads arrive at once after a change, then the board is built once and all twenty get the same board', async () => {
      await t.db('fields').where({ id: fieldId }).update({ name: 'Coulee quarter' });
      let builds = 0;
      const count = (q: { sql: string }) => {
        if (/from "board_days"/.test(q.sql)) builds++;
      };
      t.db.on('query', count);
      try {
        const answers = await Promise.all(Array.from({ length: 20 }, () => boardRes()));
        expect(answers.every((a) => a.status === 200)).toBe(true);
        expect(new Set(answers.map((a) => a.text)).size).toBe(1);
        expect(builds).toBe(1);
      } finally {
        t.db.off('query', count);
      }
    });

    it('when the client accepts gzip, then the board comes compressed, and plain when it does not', async () => {
      const cookie = (await owner.get('/api/auth/me')).request.cookies as string;
      // supertest inflates what it receives; the sizes sent show what went over the wire.
      const gz = await request(t.app).get(`/api/board?date=${DAY}`).set('Cookie', cookie).set('Accept-Encoding', 'gzip');
      expect(gz.headers['content-encoding']).toBe('gzip');
      expect(gz.headers.vary).toMatch(/Accept-Encoding/);
      const plain = await request(t.app).get(`/api/board?date=${DAY}`).set('Cookie', cookie).set('Accept-Encoding', 'identity');
      expect(plain.headers['content-encoding']).toBeUndefined();
      expect(Number(gz.headers['content-length'])).toBeLessThan(Number(plain.headers['content-length']));
      expect(gz.body).toEqual(plain.body);
    });
  });

  describe('who is signed in, on every request', () => {
    it('when the owner is made a viewer by hand, then the very next board read is refused', async () => {
      expect((await boardRes()).status).toBe(200);
      await t.db('memberships').where({ id: farm.owner.membershipId }).update({ role: 'viewer' });
      try {
        expect((await boardRes()).status).toBe(403);
      } finally {
        await t.db('memberships').where({ id: farm.owner.membershipId }).update({ role: 'owner' });
      }
      expect((await boardRes()).status).toBe(200);
    });

    it('when a membership is removed, then its session stops working at once', async () => {
      const c = new Client(t.app);
      await c.signIn(farm.viewer.email, farm.viewer.password);
      expect((await c.get('/api/auth/me')).status).toBe(200);
      await t.db('memberships').where({ id: farm.viewer.membershipId }).update({ status: 'removed' });
      try {
        expect((await c.get('/api/auth/me')).status).toBe(401);
      } finally {
        await t.db('memberships').where({ id: farm.viewer.membershipId }).update({ status: 'active' });
      }
    });

    it('when a session is used twice within a minute, then its stored expiry is moved on once', async () => {
      const c = new Client(t.app);
      await c.signIn(farm.operator.email, farm.operator.password);
      const cookies = decodeURIComponent(String((await c.get('/api/auth/me')).request.cookies));
      const sid = /furlong\.sid=s:([^.;]+)/.exec(cookies)?.[1] ?? '';
      expect(sid).not.toBe('');
      const expiry = async () => (await t.db('session').where({ sid }).first('expire'))?.expire as Date;
      const first = await expiry();
      await new Promise((r) => setTimeout(r, 20));
      expect((await c.get('/api/auth/me')).status).toBe(200);
      expect((await expiry()).getTime()).toBe(first.getTime());
    });
  });
});
