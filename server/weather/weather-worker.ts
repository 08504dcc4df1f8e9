import type PgBoss from 'pg-boss';
import { jobQueue, type JobData } from '../background/queue';
import type { Db } from '../db/knex';
import { logMessage } from '../http/errors';
import { silentLogger, type Logger } from '../logging/logger';
import { farmsWithFields } from './weather.repository';
import { refreshFarmWeather, RETRY_AFTER_MS, type RefreshOutcome } from './weather.service';

export interface WeatherWorkerOptions {
  /** The forecast endpoint: config.weatherUrl, or the local fake's. */
  url: string;
  /** How often each farm gets a refresh job, ms (default 10 min: points are due hourly, retried after 10 min). */
  scheduleMs?: number;
  /** How often to look for queued jobs, ms (default 5 s). */
  pollMs?: number;
  timeoutMs?: number;
  logger?: Logger;
}

type WeatherJob = PgBoss.Job<JobData['weather']>;

/**
 * Keeps forecasts fresh in the background process (the first server process): every few minutes
 * it queues one `weather` job per farm with fields (at most one per farm per round, pg-boss's
 * singleton slot), and works the queue: each job refreshes the farm's points that are due
 * (weather.service.ts: hourly at most). The service being down is not a job failure: the points
 * are marked and the forecast shows as stale; only a database failure fails the job for a retry.
 */
export class WeatherWorker {
  private pollTimer: NodeJS.Timeout | null = null;
  private scheduleTimer: NodeJS.Timeout | null = null;
  private running: Promise<number> | null = null;
  /** A round of queueing under way: stop() waits for it, so closing the pool never cuts it off. */
  private scheduling: Promise<void> | null = null;
  private readonly boss: PgBoss;
  private readonly log: Logger;
  private readonly scheduleMs: number;
  private readonly pollMs: number;

  constructor(
    private readonly db: Db,
    private readonly options: WeatherWorkerOptions,
  ) {
    this.boss = jobQueue(db);
    this.log = options.logger ?? silentLogger();
    this.scheduleMs = options.scheduleMs ?? RETRY_AFTER_MS;
    this.pollMs = options.pollMs ?? 5000;
  }

  start(): void {
    if (this.pollTimer) return;
    this.log.info({ scheduleMs: this.scheduleMs }, 'weather worker started');
    const schedule = () => {
      this.scheduling = this.schedule()
        .then(() => undefined)
        .catch((err: unknown) => this.log.warn({ error: logMessage(err) }, 'weather refresh jobs could not be queued'))
        .finally(() => {
          this.scheduling = null;
          if (this.scheduleTimer) this.scheduleTimer = setTimeout(schedule, this.scheduleMs);
        });
    };
    const poll = () => {
      void this.drain()
        .catch((err: unknown) => this.log.warn({ error: logMessage(err) }, 'weather run stopped early'))
        .finally(() => {
          if (this.pollTimer) this.pollTimer = setTimeout(poll, this.pollMs);
        });
    };
    this.scheduleTimer = setTimeout(schedule, 0);
    this.pollTimer = setTimeout(poll, 500);
  }

  async stop(): Promise<void> {
    if (this.pollTimer) clearTimeout(this.pollTimer);
    if (this.scheduleTimer) clearTimeout(this.scheduleTimer);
    this.pollTimer = this.scheduleTimer = null;
    await this.scheduling;
    await this.running?.catch(() => undefined);
  }

  /** Queues one refresh job per farm with fields; a farm that has one this round gets no second. Returns how many were queued. */
  async schedule(): Promise<number> {
    let queued = 0;
    for (const farm of await farmsWithFields(this.db)) {
      const id = await this.boss.send('weather', { farm } satisfies JobData['weather'], {
        singletonKey: `farm-${farm}`,
        singletonSeconds: Math.max(1, Math.round(this.scheduleMs / 1000)),
      });
      if (id) queued++;
    }
    return queued;
  }

  /** Works every queued weather job now; returns how many were done. One run at a time. */
  drain(): Promise<number> {
    this.running ??= this.work().finally(() => (this.running = null));
    return this.running;
  }

  private async work(): Promise<number> {
    let done = 0;
    for (;;) {
      const [job] = (await this.boss.fetch<JobData['weather']>('weather', { batchSize: 1 })) as WeatherJob[];
      if (!job) return done;
      this.log.info({ jobId: job.id, queue: 'weather' }, 'job started');
      let outcome: RefreshOutcome;
      try {
        outcome = await refreshFarmWeather(this.db, job.data.farm, {
          url: this.options.url,
          timeoutMs: this.options.timeoutMs,
          logger: this.log,
        });
      } catch (err) {
        // The database failed (the service's own failures are an outcome, not an error).
        await this.boss.fail('weather', job.id, { message: logMessage(err) }).catch(() => undefined);
        throw err;
      }
      await this.boss.complete('weather', job.id, outcome as unknown as object);
      done++;
    }
  }
}
