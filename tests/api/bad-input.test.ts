import { makeFarm, type TestFarm } from '../support/farm-factory';
import { Client, startTestApp, type TestApp } from '../support/test-app';

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
    const res = await owner.agent.post('/api/members/invite').set('X-XSRF-TOKEN', owner.xsrf).set('Content-Type', 'application/json').send('{"email": "a@b.c",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { code: 'bad_json', message: 'The request body is not valid JSON' } });
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
    expect(res.body.error).toEqual({ code: 'not_found', message: 'There is no API at GET /no-such-thing' });
  });

  it('when the password is too short, then 400 says how long it must be', async () => {
    const res = await owner.post('/api/auth/set-password', { token: 'y'.repeat(43), password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.password).toBe('Use at least 10 characters');
  });
});
