// The phone track on the device: the fixes recorded for a job, the chunks cut from them to send
// (each with an id made here, so a chunk sent again after a lost answer is stored once on the
// farm's server), and which jobs the operator turned "Record track" on for. A database of its
// own, apart from the run sheet's outbox, so a reload or a closed browser loses nothing.
import type { TrackPointInput } from '@shared/schemas/phone-track';
import { MAX_POINTS_PER_CHUNK } from '@shared/limits';
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { RecordedFix } from './track-thinning';

/** Whose track: sent only while the same person is signed in on the same farm. */
export interface Recorder {
  userId: number;
  farmId: number;
}

interface KeptFix extends Recorder {
  id?: number;
  jobId: number;
  fix: RecordedFix;
}

export interface KeptChunk extends Recorder {
  chunkId: string;
  jobId: number;
  /** Order of cutting: chunks are sent oldest first. */
  seq: number;
  points: TrackPointInput[];
}

interface Switch extends Recorder {
  key: string;
  jobId: number;
  on: boolean;
  /** The last fix kept for the job, sent or not (the thinning rule goes on from it after a reload). */
  last?: RecordedFix | null;
}

interface TrackDbSchema extends DBSchema {
  fixes: { key: number; value: KeptFix; indexes: { job: [number, number, number] } };
  chunks: { key: string; value: KeptChunk; indexes: { seq: number } };
  switches: { key: string; value: Switch };
}

const switchKey = (who: Recorder, jobId: number) => `${who.userId}:${who.farmId}:${jobId}`;
const mine = (r: Recorder, who: Recorder) => r.userId === who.userId && r.farmId === who.farmId;

export const pointOf = (f: RecordedFix): TrackPointInput => ({
  at: new Date(f.at).toISOString(),
  lat: f.lat,
  lon: f.lon,
  accuracyM: f.accuracyM,
  headingDeg: f.headingDeg,
  speedMps: f.speedMps,
});

export class TrackDb {
  private constructor(private readonly db: IDBPDatabase<TrackDbSchema>) {}

  static async open(name = 'furlong-phone-track'): Promise<TrackDb> {
    const db = await openDB<TrackDbSchema>(name, 1, {
      upgrade(d) {
        d.createObjectStore('fixes', { keyPath: 'id', autoIncrement: true }).createIndex('job', ['userId', 'farmId', 'jobId']);
        d.createObjectStore('chunks', { keyPath: 'chunkId' }).createIndex('seq', 'seq');
        d.createObjectStore('switches', { keyPath: 'key' });
      },
    });
    return new TrackDb(db);
  }

  close(): void {
    this.db.close();
  }

  async setSwitch(who: Recorder, jobId: number, on: boolean): Promise<void> {
    const tx = this.db.transaction('switches', 'readwrite');
    const was = await tx.store.get(switchKey(who, jobId));
    await tx.store.put({ key: switchKey(who, jobId), ...who, jobId, on, last: was?.last ?? null });
    await tx.done;
  }

  async switchOn(who: Recorder, jobId: number): Promise<boolean> {
    return (await this.db.get('switches', switchKey(who, jobId)))?.on === true;
  }

  /** Keeps a fix, and remembers it as the job's last one in the same transaction. */
  async addFix(who: Recorder, jobId: number, fix: RecordedFix): Promise<void> {
    const tx = this.db.transaction(['fixes', 'switches'], 'readwrite');
    const key = switchKey(who, jobId);
    const sw = await tx.objectStore('switches').get(key);
    await tx.objectStore('fixes').add({ ...who, jobId, fix });
    await tx.objectStore('switches').put({ key, ...who, jobId, on: sw?.on ?? true, last: fix });
    await tx.done;
  }

  /** The last fix kept for the job (the thinning rule starts from it after a reload). */
  async lastFix(who: Recorder, jobId: number): Promise<RecordedFix | null> {
    return (await this.db.get('switches', switchKey(who, jobId)))?.last ?? null;
  }

  /**
   * Cuts the person's fixes not yet in a chunk into chunks of at most MAX_POINTS_PER_CHUNK, each
   * with a new id, in one transaction: a fix is either waiting or in exactly one chunk.
   */
  async cutChunks(who: Recorder, newId: () => string): Promise<void> {
    const tx = this.db.transaction(['fixes', 'chunks'], 'readwrite');
    const byJob = new Map<number, Array<{ id: number; fix: RecordedFix }>>();
    for (const f of await tx.objectStore('fixes').getAll())
      if (mine(f, who)) byJob.set(f.jobId, [...(byJob.get(f.jobId) ?? []), { id: f.id!, fix: f.fix }]);
    const last = await tx.objectStore('chunks').index('seq').openCursor(null, 'prev');
    let seq = (last?.value.seq ?? 0) + 1;
    for (const [jobId, fixes] of byJob)
      for (let i = 0; i < fixes.length; i += MAX_POINTS_PER_CHUNK) {
        const part = fixes.slice(i, i + MAX_POINTS_PER_CHUNK);
        await tx.objectStore('chunks').add({ ...who, chunkId: newId(), jobId, seq: seq++, points: part.map((p) => pointOf(p.fix)) });
        for (const p of part) await tx.objectStore('fixes').delete(p.id);
      }
    await tx.done;
  }

  /** The person's chunks waiting to be sent, oldest first. */
  async chunks(who: Recorder): Promise<KeptChunk[]> {
    return (await this.db.getAllFromIndex('chunks', 'seq')).filter((c) => mine(c, who));
  }

  async dropChunk(chunkId: string): Promise<void> {
    await this.db.delete('chunks', chunkId);
  }

  /** Points of the person's job on this device not yet sent (waiting and in chunks). */
  async unsent(who: Recorder, jobId: number): Promise<number> {
    const fixes = await this.db.countFromIndex('fixes', 'job', IDBKeyRange.only([who.userId, who.farmId, jobId]));
    const chunks = (await this.chunks(who)).filter((c) => c.jobId === jobId);
    return fixes + chunks.reduce((n, c) => n + c.points.length, 0);
  }
}
