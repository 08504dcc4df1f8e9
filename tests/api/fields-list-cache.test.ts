// The fields list is kept per farm revision and season, like the board: a change of any kind
// (the API, or plain SQL as a seed would) shows on the next read, another farm never sees it, and
// conditional and compressed answers carry the same list.
import { makeFarm, type TestFarm } from '../support/farm-factory';
import { rect } from '../support/geo-fixtures';
import { Client, startTestApp, type TestApp } from '../support/test-app';

describe('the fields list and the farm revision', () => {
  let t: TestApp;
  let farm: TestFarm;
  let other: TestFarm;
  let owner: Client;
  let viewer: Client;
  const names = async (c: Client): Promise<string[]> =>
    ((await c.get('/api/fields')).body as Array<{ name: string }>).map((f) => f.name).sort();
  const insertField = (farmId: number, name: string, lon: number) =>
    t
      .db('fields')
      .insert({ farm_id: farmId, name, boundary: JSON.stringify(rect(lon, 47.2, 0.01, 0.01)), area_m2: 160 * 4046.8564224, acres: 160 });

  beforeAll(async () => {
    t = await startTestApp();
    farm = await makeFarm(t.db, 'List');
    other = await makeFarm(t.db, 'List other');
    owner = new Client(t.app);
    await owner.signIn(farm.owner.email, farm.owner.password);
    viewer = new Client(t.app);
    await viewer.signIn(other.viewer.email, other.viewer.password);
  });
  afterAll(() => t.close());

  it('when a field is added by SQL or renamed through the API, then the next read shows it, and another farm never does', async () => {
    await insertField(farm.id, 'Coulee quarter', -99.5);
    expect(await names(owner)).toEqual(['Coulee quarter']);
    await insertField(farm.id, 'Slough eighty', -99.4);
    expect(await names(owner)).toEqual(['Coulee quarter', 'Slough eighty']);
    const id = ((await owner.get('/api/fields')).body as Array<{ id: number; name: string }>).find((f) => f.name === 'Slough eighty')!.id;
    expect((await owner.patch(`/api/fields/${id}`, { name: 'Bin site eighty' })).status).toBe(200);
    expect(await names(owner)).toEqual(['Bin site eighty', 'Coulee quarter']);
    expect(await names(viewer)).toEqual([]);
  });

  it('when nothing changes, then a conditional read gets 304, and the gzip answer is the same list', async () => {
    const first = await owner.get('/api/fields');
    expect(first.headers.etag).toMatch(/^"fields-/);
    const again = await owner.agent.get('/api/fields').set('If-None-Match', first.headers.etag as string);
    expect(again.status).toBe(304);
    // supertest unpacks gzip itself: the header says it came compressed.
    const zipped = await owner.agent.get('/api/fields').set('Accept-Encoding', 'gzip');
    expect(zipped.status).toBe(200);
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body).toEqual(first.body);
  });
});
