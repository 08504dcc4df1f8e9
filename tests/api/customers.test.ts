// Customers of custom work: the owner keeps them, the viewer (the accountant) reads them, operators
// see none; a field marked as a customer's carries its jobs on the board exactly like the farm's own
// (same conflicts, run sheet and logs). Expected values here are the fixture's own inputs; the one
// rule from outside is RFC 5321/5322's address form, checked through the shared e-mail schema.
import type { Board } from '../../shared/schemas/board';
import type { Customer } from '../../shared/schemas/customers';
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { signedIn, startTestApp, type Client, type TestApp } from '../support/test-app';
import { insertImplement, insertMachine } from './matrix/board';

let t: TestApp;
let farm: TestFarm;
let other: TestFarm;
let owner: Client;
let viewer: Client;
let operator: Client;
let stranger: Client;
let n = 0;

beforeAll(async () => {
  t = await startTestApp();
  farm = await makeFarm(t.db, 'Customers');
  other = await makeFarm(t.db, 'Elsewhere');
  owner = await signedIn(t.app, farm.owner.email, farm.owner.password);
  viewer = await signedIn(t.app, farm.viewer.email, farm.viewer.password);
  operator = await signedIn(t.app, farm.operator.email, farm.operator.password);
  stranger = await signedIn(t.app, other.owner.email, other.owner.password);
});
afterAll(() => t.close());

async function field(acres: number): Promise<number> {
  const [f] = await t
    .db('fields')
    .insert({
      farm_id: farm.id,
      name: `Custom Field ${++n}`,
      boundary: JSON.stringify(rect(-98.5 + n * 0.01, 47.1, 0.005, 0.005)),
      area_m2: acres * 4046.8564224,
      acres,
    })
    .returning('id');
  return f.id;
}

describe('customers', () => {
  it('when the owner adds, changes and lists a customer, then the viewer reads the same and operators are refused', async () => {
    const created = await owner.post('/api/customers', {
      name: '  Prairie Gate Farms ',
      email: 'Accounts@PrairieGate.test',
      address: 'RR 2\nMapleton',
    });
    expect(created.status).toBe(201);
    expect(created.body).toEqual({
      id: expect.any(Number),
      name: 'Prairie Gate Farms',
      // E-mail addresses are compared without case by the shared schema (domain case-insensitive, RFC 5321 §2.4).
      email: 'accounts@prairiegate.test',
      address: 'RR 2\nMapleton',
      fields: [],
    });
    const id = created.body.id as number;
    const changed = await owner.patch(`/api/customers/${id}`, { address: '' });
    expect(changed.status).toBe(200);
    expect(changed.body.address).toBeNull();

    const seen = (await viewer.get('/api/customers')).body as Customer[];
    expect(seen.find((c) => c.id === id)).toMatchObject({ name: 'Prairie Gate Farms', address: null });
    expect((await operator.get('/api/customers')).status).toBe(403);
    expect((await operator.get(`/api/customers/${id}`)).status).toBe(403);
    expect((await viewer.post('/api/customers', { name: 'X', email: 'x@x.test' })).status).toBe(403);
    expect((await stranger.get(`/api/customers/${id}`)).status).toBe(404);
  });

  it('when a customer is sent without a name or with a bad e-mail, then 400 names the box and nothing is saved', async () => {
    const before = await t.db('customers').where({ farm_id: farm.id }).count({ n: '*' });
    const res = await owner.post('/api/customers', { name: ' ', email: 'not an address' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ name: expect.any(String), email: 'Enter a valid e-mail address' });
    expect(await t.db('customers').where({ farm_id: farm.id }).count({ n: '*' })).toEqual(before);
  });

  it('when a field is marked as a customer’s, then the customer lists it; null makes it the farm’s own again; another farm’s customer is not found', async () => {
    const c = (await owner.post('/api/customers', { name: 'Coulee Ranch', email: 'coulee@ranch.test' })).body as Customer;
    const f = await field(80);
    expect((await owner.put(`/api/fields/${f}/customer`, { customerId: c.id })).body).toEqual({ fieldId: f, customerId: c.id });
    expect((await owner.get(`/api/customers/${c.id}`)).body.fields).toEqual([{ id: f, name: expect.any(String), acres: 80 }]);
    expect((await stranger.put(`/api/fields/${f}/customer`, { customerId: null })).status).toBe(404);
    const theirs = (await stranger.post('/api/customers', { name: 'Not yours', email: 'n@y.test' })).body as Customer;
    expect((await owner.put(`/api/fields/${f}/customer`, { customerId: theirs.id })).status).toBe(404);
    expect((await owner.put(`/api/fields/${f}/customer`, { customerId: null })).status).toBe(200);
    expect((await owner.get(`/api/customers/${c.id}`)).body.fields).toEqual([]);
  });

  it('when a customer is removed, then their fields become the farm’s own and the jobs on them stay', async () => {
    const c = (await owner.post('/api/customers', { name: 'Short Term', email: 'short@term.test' })).body as Customer;
    const f = await field(40);
    await owner.put(`/api/fields/${f}/customer`, { customerId: c.id });
    expect((await owner.delete(`/api/customers/${c.id}`)).status).toBe(204);
    expect((await t.db('fields').where({ id: f }).first('customer_id')).customer_id).toBeNull();
    expect((await owner.get(`/api/customers/${c.id}`)).status).toBe(404);
  });
});

describe('a custom job on the board', () => {
  it('when a job on a customer’s field double-books a machine, is started and finished, then the board, run sheet and log treat it like any job', async () => {
    const c = (await owner.post('/api/customers', { name: 'Willow Flats', email: 'willow@flats.test' })).body as Customer;
    const theirs = await field(120);
    const ours = await field(60);
    await owner.put(`/api/fields/${theirs}/customer`, { customerId: c.id });
    const day = '2026-04-28';
    const board = async (): Promise<Board> => (await owner.get(`/api/board?date=${day}`)).body;
    const machineId = await insertMachine(t.db, farm.id);
    const add = async (fieldId: number, startTime: string) =>
      owner.post('/api/assignments', {
        version: (await board()).version,
        date: day,
        operation: 'harrowing',
        fieldId,
        operatorId: farm.operator.membershipId,
        machineId,
        implementId: await insertImplement(t.db, farm.id),
        startTime,
        endTime: '12:00',
      });
    const custom = await add(theirs, '08:00');
    expect(custom.status).toBe(201);
    const jobId = custom.body.savedAssignmentId as number;
    const own = await add(ours, '09:00');
    // The same tractor in two places at once is a conflict whoever owns the field.
    const clash = (own.body as Board).conflicts.filter((x) => x.code === 'machine_double_booked');
    expect(clash.length).toBeGreaterThan(0);
    expect(clash[0].assignmentIds).toEqual(expect.arrayContaining([jobId, own.body.savedAssignmentId]));

    const sheet = await operator.get(`/api/run-sheet?date=${day}`);
    expect(sheet.status).toBe(200);
    expect(JSON.stringify(sheet.body)).toContain(String(jobId));
    // Operators see the job, never the customer or any money.
    expect(JSON.stringify(sheet.body)).not.toContain('Willow Flats');

    const at = (hhmm: string) => `${day}T${hhmm}:00-05:00`;
    expect((await operator.post(`/api/assignments/${jobId}/events`, { type: 'start', at: at('08:00') })).status).toBe(201);
    expect((await operator.post(`/api/assignments/${jobId}/events`, { type: 'finish', at: at('11:30'), acres: 118.5 })).status).toBe(201);
    const card = (await board()).assignments.find((a) => a.id === jobId)!;
    expect(card).toMatchObject({ state: 'finished', log: { acresDone: 118.5 } });
  });
});
