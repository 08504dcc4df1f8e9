import { MAX_POINTS_PER_CHUNK } from '@shared/limits';
import { freshDeviceStorage } from '../testing/device';
import { TrackDb } from './track-db';
import type { RecordedFix } from './track-thinning';

const ada = { userId: 1, farmId: 7 };
const bo = { userId: 2, farmId: 7 };
const fix = (i: number): RecordedFix => ({
  at: Date.UTC(2026, 4, 10, 7) + i * 1000,
  lat: 47.6 + i * 1e-4,
  lon: -99.9,
  accuracyM: 4,
  headingDeg: 0,
  speedMps: 5,
});

describe('TrackDb (the phone track kept on the device)', () => {
  beforeEach(() => freshDeviceStorage());

  it('when fixes are kept and the database is opened again (a reload), then the switch, the last fix and the fixes are still there', async () => {
    let db = await TrackDb.open('spec-track');
    await db.setSwitch(ada, 3, true);
    for (let i = 0; i < 5; i++) await db.addFix(ada, 3, fix(i));
    db.close();
    db = await TrackDb.open('spec-track');
    expect(await db.switchOn(ada, 3)).toBe(true);
    expect(await db.lastFix(ada, 3)).toEqual(fix(4));
    expect(await db.unsent(ada, 3)).toBe(5);
    // Another person on the same phone sees none of it.
    expect(await db.switchOn(bo, 3)).toBe(false);
    expect(await db.unsent(bo, 3)).toBe(0);
  });

  it('when fixes are cut into chunks, then each fix is in exactly one chunk of at most the chunk size, in order, and a chunk keeps its id until dropped', async () => {
    const db = await TrackDb.open('spec-track');
    const n = MAX_POINTS_PER_CHUNK + 10;
    for (let i = 0; i < n; i++) await db.addFix(ada, 3, fix(i));
    await db.addFix(bo, 3, fix(0));
    let id = 0;
    await db.cutChunks(ada, () => `chunk-${++id}`);
    const chunks = await db.chunks(ada);
    expect(chunks.map((c) => [c.chunkId, c.points.length])).toEqual([
      ['chunk-1', MAX_POINTS_PER_CHUNK],
      ['chunk-2', 10],
    ]);
    expect(chunks.flatMap((c) => c.points).map((p) => p.at)).toEqual(
      Array.from({ length: n }, (_, i) => new Date(fix(i).at).toISOString()),
    );
    expect(await db.unsent(ada, 3)).toBe(n);
    // Cutting again (a resend after a lost answer) makes no new chunk: the same ids go again.
    await db.cutChunks(ada, () => `chunk-${++id}`);
    expect((await db.chunks(ada)).map((c) => c.chunkId)).toEqual(['chunk-1', 'chunk-2']);
    await db.dropChunk('chunk-1');
    expect(await db.unsent(ada, 3)).toBe(10);
    // The other person's fix waits for them.
    expect(await db.unsent(bo, 3)).toBe(1);
  });
});
