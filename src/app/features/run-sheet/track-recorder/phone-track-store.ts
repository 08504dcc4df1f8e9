// "Record track" for the whole app: one recorder per job the operator turned it on for, writing
// thinned fixes to the phone (track-db.ts) and sending them in chunks to the farm's own server
// whenever there is a connection (every 20 s while recording, when the connection returns, and
// when recording stops). It follows the job's state as the run sheet shows it: recording only
// while the job is underway; a pause stops it until the job resumes; a finish turns it off.
import { HttpClient } from '@angular/common/http';
import { Injectable, type OnDestroy, inject, signal } from '@angular/core';
import type { AssignmentState } from '@shared/schemas/jobs';
import type { TrackChunkAnswer } from '@shared/schemas/phone-track';
import { firstValueFrom } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { ApiError } from '../../../core/http/api-error';
import { API } from '../../../core/http/api-paths';
import { GEOLOCATION } from '../job-position/passes-source';
import { positionError } from '../job-position/job-position';
import { TrackDb, type Recorder } from './track-db';
import { fixOf, keepFix, type RecordedFix } from './track-thinning';

/** What one job's recorder shows. */
export interface JobTrack {
  /** The operator's switch for this job (kept on the phone). */
  on: boolean;
  /** Positions are being taken now (switch on and the job underway). */
  recording: boolean;
  /** Points on this phone not yet on the server. */
  unsent: number;
  /** Points the server has taken since this page opened. */
  sent: number;
  lastSentAt: Date | null;
  problem: string | null;
}

const NONE: JobTrack = { on: false, recording: false, unsent: 0, sent: 0, lastSentAt: null, problem: null };
/** How often points are sent while recording (common practice, no published source). */
export const SEND_EVERY_MS = 20_000;
/** Position reads asked of the phone: fresh and precise; no cached fix. */
const WATCH_OPTIONS: PositionOptions = { enableHighAccuracy: true, maximumAge: 0, timeout: 60_000 };
/** "Try again later": no answer, a timeout, the server in trouble, a session that ended. */
const retryLater = (status: number) => status === 0 || status === 401 || status === 408 || status === 429 || status >= 500;

@Injectable({ providedIn: 'root' })
export class PhoneTrackStore implements OnDestroy {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly geolocation = inject(GEOLOCATION);
  private opened: Promise<TrackDb | null> | null = null;
  private readonly watches = new Map<number, { id: number; last: RecordedFix | null; who: Recorder }>();
  private timer: ReturnType<typeof setInterval> | null = null;
  private sending: Promise<void> = Promise.resolve();
  private readonly online = () => void this.send();

  readonly jobs = signal<ReadonlyMap<number, JobTrack>>(new Map());

  constructor() {
    if (typeof window !== 'undefined') window.addEventListener('online', this.online);
  }

  ngOnDestroy(): void {
    if (typeof window !== 'undefined') window.removeEventListener('online', this.online);
    for (const id of [...this.watches.keys()]) this.stopWatch(id);
  }

  /** The phone's track database; null when this browser keeps none (private mode, no IndexedDB). */
  private db(): Promise<TrackDb | null> {
    this.opened ??= typeof indexedDB === 'undefined' ? Promise.resolve(null) : TrackDb.open().catch(() => null);
    return this.opened;
  }

  private who(): Recorder | null {
    const me = this.auth.me();
    return me ? { userId: me.user.id, farmId: me.farm.id } : null;
  }

  private patch(jobId: number, change: Partial<JobTrack>): void {
    const next = new Map(this.jobs());
    next.set(jobId, { ...(next.get(jobId) ?? NONE), ...change });
    this.jobs.set(next);
  }

  private async count(jobId: number): Promise<void> {
    const db = await this.db();
    const who = this.who();
    if (db && who) this.patch(jobId, { unsent: await db.unsent(who, jobId) });
  }

  /**
   * Follows the job as the run sheet shows it (its unsent actions included): records while it is
   * underway and the switch is on; a finish or call-off turns the switch off. Sends what waits.
   */
  async follow(jobId: number, state: AssignmentState): Promise<void> {
    const db = await this.db();
    const who = this.who();
    if (!db || !who) return;
    let on = await db.switchOn(who, jobId);
    if (on && (state === 'finished' || state === 'called-off')) {
      await db.setSwitch(who, jobId, false);
      on = false;
    }
    this.patch(jobId, { on });
    if (on && state === 'underway') this.startWatch(jobId, who, db);
    else this.stopWatch(jobId);
    await this.count(jobId);
    void this.send();
  }

  /** The operator's switch: on records while the job is underway; off stops now and sends what waits. */
  async turn(jobId: number, on: boolean, state: AssignmentState): Promise<void> {
    const db = await this.db();
    const who = this.who();
    if (!db) {
      this.patch(jobId, { problem: 'This browser keeps nothing on the phone (private mode?), so it cannot record a track.' });
      return;
    }
    if (!who) return;
    if (on && !this.geolocation) {
      this.patch(jobId, { problem: 'This browser cannot tell the phone’s position.' });
      return;
    }
    await db.setSwitch(who, jobId, on);
    this.patch(jobId, { problem: null });
    await this.follow(jobId, state);
  }

  private startWatch(jobId: number, who: Recorder, db: TrackDb): void {
    if (this.watches.has(jobId) || !this.geolocation) return;
    const watch = { id: 0, last: null as RecordedFix | null, who };
    this.watches.set(jobId, watch);
    // Fixes wait for the last one kept (a phone may hand a new watch its last, older fix again).
    const ready = db.lastFix(who, jobId).then(
      (f) => (watch.last = f),
      () => null,
    );
    // The permission prompt comes from the operator's tap on the switch, never before.
    watch.id = this.geolocation.watchPosition(
      (pos) => {
        const fix = fixOf(pos);
        void ready.then(() => this.take(jobId, watch, fix));
      },
      (err) => {
        this.patch(jobId, { problem: positionError(err.code) });
        if (err.code === 1) void this.turn(jobId, false, 'paused');
      },
      WATCH_OPTIONS,
    );
    this.patch(jobId, { recording: true });
    this.timer ??= setInterval(() => void this.send(), SEND_EVERY_MS);
  }

  private stopWatch(jobId: number): void {
    const w = this.watches.get(jobId);
    if (w) this.geolocation?.clearWatch(w.id);
    this.watches.delete(jobId);
    if (this.jobs().get(jobId)?.recording) this.patch(jobId, { recording: false });
    if (!this.watches.size && this.timer) {
      clearInterval(this.timer);
      this.timer = null;
    }
  }

  private async take(jobId: number, watch: { last: RecordedFix | null; who: Recorder }, fix: RecordedFix): Promise<void> {
    if (!keepFix(watch.last, fix)) return;
    watch.last = fix;
    const db = await this.db();
    if (!db || this.watches.get(jobId) !== watch) return;
    await db.addFix(watch.who, jobId, fix);
    this.patch(jobId, { problem: null, unsent: (this.jobs().get(jobId)?.unsent ?? 0) + 1 });
  }

  /** Sends the signed-in person's points waiting on the phone, chunk by chunk, oldest first. */
  send(): Promise<void> {
    this.sending = this.sending.then(() => this.sendNow()).catch(() => undefined);
    return this.sending;
  }

  private async sendNow(): Promise<void> {
    const db = await this.db();
    const who = this.who();
    if (!db || !who || (typeof navigator !== 'undefined' && navigator.onLine === false)) return;
    await db.cutChunks(who, () => crypto.randomUUID());
    for (const chunk of await db.chunks(who)) {
      try {
        const answer = await firstValueFrom(
          this.http.post<TrackChunkAnswer>(API.assignmentTrackPoints(chunk.jobId), { chunkId: chunk.chunkId, points: chunk.points }),
        );
        await db.dropChunk(chunk.chunkId);
        const was = this.jobs().get(chunk.jobId) ?? NONE;
        this.patch(chunk.jobId, { sent: was.sent + answer.points, lastSentAt: new Date() });
      } catch (err) {
        const status = err instanceof ApiError ? err.status : 0;
        if (retryLater(status)) return;
        // Refused for good (the job was moved to someone else or deleted): kept no longer, and said.
        await db.dropChunk(chunk.chunkId);
        this.patch(chunk.jobId, {
          problem: `The farm's server did not take ${chunk.points.length} track points: ${(err as Error).message}`,
        });
      } finally {
        await this.count(chunk.jobId);
      }
    }
  }
}
