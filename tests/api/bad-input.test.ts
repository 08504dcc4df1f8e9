import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

// PostgreSQL `integer` holds at most 2^31 - 1 (PostgreSQL manual, "Numeric Types").
const TOO_BIG = 2 ** 31;
const NUL = '\u0000';

describe('bad input gets the error shape and stores nothing', () => {
  let t: TestApp;
  let farm: TestFarm;
  let owner: Client;
  const memberCount = async () => Number((await t.db('memberships').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'Bad');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
  });
  afterAll(() => t.close());

  it('when the body is malformed JSON, then 400 bad_json', async () => {
    const before = await memberCount();
    const res = await owner.agent
      .post('/api/members/invite')
      .set('X-XSRF-TOKEN', owner.xsrf)
      .set('Content-Type', 'application/json')
      .send('{"email": "a@b.c",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: { code: 'bad_json', message: 'The request body is not valid JSON', requestId: res.headers['x-request-id'] },
    });
    expect(await memberCount()).toBe(before);
  });

  it('when a field has the wrong type, then 400 names the field', async () => {
    const before = await memberCount();
    const res = await owner.post('/api/members/invite', { email: 42, name: 'X', role: 'operator' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.fields).toHaveProperty('email');
    expect(res.body.error.message).toMatch(/email/);
    expect(await memberCount()).toBe(before);
  });

  it('when the role is not one of owner, operator, viewer, then 400', async () => {
    const res = await owner.post('/api/members/invite', { email: 'x@furlong.test', name: 'X', role: 'boss' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('role');
    expect(await t.db('users').where({ email: 'x@furlong.test' }).first()).toBeUndefined();
  });

  it('when the body is larger than 1 MB, then 413', async () => {
    const before = await memberCount();
    const res = await owner.post('/api/members/invite', { email: 'big@furlong.test', name: 'x'.repeat(1_100_000), role: 'viewer' });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(await memberCount()).toBe(before);
  });

  it('when an id in the address is not a number, then 400', async () => {
    const res = await owner.patch('/api/members/abc', { role: 'viewer' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('id');
  });

  it('when an API path does not exist, then a JSON 404', async () => {
    const res = await owner.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({
      code: 'not_found',
      message: 'There is no API at GET /no-such-thing',
      requestId: res.headers['x-request-id'],
    });
  });

  it('when the password is too short, then 400 says how long it must be', async () => {
    const res = await owner.post('/api/auth/set-password', { token: 'y'.repeat(43), password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.password).toBe('Use at least 10 characters');
  });

  describe('numbers too large to be an id, and text with a NUL character', () => {
    // These used to reach PostgreSQL, fail there and answer 500 with the SQL in the log.
    const expect400 = (
      res: { status: number; body: { error: { code: string; message: string; fields?: Record<string, string> } } },
      field: string,
      text: RegExp,
    ) => {
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.message).toMatch(text);
      expect(res.body.error.fields).toHaveProperty([field]);
      expect(t.logged).toEqual([]);
    };

    it('when an id in the address is above 2^31 - 1, then 400 on every kind of route and nothing is logged', async () => {
      expect400(await owner.get(`/api/fields/${TOO_BIG}`), 'id', /too large/);
      expect400(await owner.patch(`/api/members/${TOO_BIG}`, { role: 'viewer' }), 'id', /too large/);
      expect400(await owner.delete(`/api/fleet/machines/${TOO_BIG}`), 'id', /too large/);
      expect400(await owner.delete(`/api/fields/1/hazards/${TOO_BIG}`), 'hazardId', /too large/);
      expect400(await owner.put(`/api/crew/${TOO_BIG}/skills/seeding`, { level: 'qualified' }), 'membershipId', /too large/);
      expect400(await owner.get(`/api/run-sheet?date=2026-05-04&membershipId=${TOO_BIG}`), 'membershipId', /too large/);
    });

    it('when an id in a JSON body is above 2^31 - 1, then 400 names it and nothing is stored', async () => {
      const before = Number((await t.db('assignments').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
      const res = await owner.post('/api/assignments', {
        version: 0,
        date: '2026-05-04',
        operation: 'seeding',
        fieldId: TOO_BIG,
        operatorId: farm.operator.membershipId,
        machineId: 1,
        implementId: 1,
      });
      expect400(res, 'fieldId', /too large/);
      expect400(await owner.post('/api/board/2026-05-04/publish', { version: TOO_BIG }), 'version', /version/);
      expect(Number((await t.db('assignments').where({ farm_id: farm.id }).count({ n: '*' }))[0].n)).toBe(before);
    });

    it('when a form field holds a NUL character, then 400 names the field and nothing is stored', async () => {
      const before = Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
      expect400(
        await owner.post('/api/fields', { name: `North${NUL}quarter`, boundary: rect(-99.5, 47.2, 0.01, 0.01) }),
        'name',
        /name must not contain a NUL character/,
      );
      expect(Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n)).toBe(before);
      const members = await memberCount();
      expect400(
        await owner.post('/api/members/invite', { email: 'nul@furlong.test', name: `Nul${NUL}`, role: 'viewer' }),
        'name',
        /NUL character/,
      );
      expect(await memberCount()).toBe(members);
      // Deep inside a body, and in a key: still named, still 400.
      expect400(
        await owner.post('/api/fields', { name: 'Deep', boundary: { ...rect(-99.5, 47.2, 0.01, 0.01), extra: [{ note: `x${NUL}` }] } }),
        'boundary.extra.0.note',
        /NUL/,
      );
    });

    it('when the address or the query holds a NUL character, then 400', async () => {
      expect400(await owner.get('/api/fields/%00'), 'id', /NUL character/);
      expect400(await owner.get('/api/fields?season=%00'), 'season', /NUL character/);
      expect400(await owner.get('/api/board?date=2026-05-04%00'), 'date', /NUL character/);
    });

    it('when the names chosen in an import (a multipart form field) hold a NUL character, then 400 and nothing is saved', async () => {
      const before = Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n);
      const geojson = JSON.stringify({
        type: 'FeatureCollection',
        features: [{ type: 'Feature', properties: { name: 'Home' }, geometry: rect(-99.4, 47.3, 0.01, 0.01) }],
      });
      const res = await owner.agent
        .post('/api/fields/import')
        .set('X-XSRF-TOKEN', owner.xsrf)
        .field('selection', JSON.stringify([{ index: 0, name: `Home${NUL}` }]))
        .attach('file', Buffer.from(geojson), 'home.geojson');
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.message).toMatch(/field name must not contain a NUL character/);
      expect(t.logged).toEqual([]);
      expect(Number((await t.db('fields').where({ farm_id: farm.id }).count({ n: '*' }))[0].n)).toBe(before);
    });
  });
});
