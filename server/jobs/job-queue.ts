import PgBoss from 'pg-boss';
import type { Kysely } from 'kysely';
import type { Store } from '../store/connection.ts';
import type { Database } from '../store/database.ts';
import { jobSql } from '../store/job-sql.ts';

/** One kind of job: its queue's name and how its jobs are tried. */
export interface QueueSpec {
  name: string;
  /** Tries after the first; each waits twice as long as the one before, from `retryDelaySeconds`. */
  retryLimit: number;
  retryDelaySeconds: number;
  /** A job still running after this long is taken to have lost its process, and is tried again. */
  expireInSeconds: number;
  /** The queue that receives a job once its tries are used up. */
  deadLetter?: string;
}

/** What a job's handler learns of it besides its data. */
export interface JobAttempt {
  id: string;
  /** Tries before this one. */
  retryCount: number;
  retryLimit: number;
}

export type JobHandler<T> = (data: T, attempt: JobAttempt) => Promise<void>;

/** Told when a job's try ends in this process (the metrics time them). */
export interface JobWatch {
  ended(queue: string, outcome: 'completed' | 'failed', seconds: number): void;
}

export const JOB_STATES = ['created', 'retry', 'active', 'completed', 'cancelled', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];

// How often an idle worker asks for a job, and how often the expired jobs of dead processes are sent
// back: with a job's expiry these bound how soon another process takes up a dead one's job.
const POLL_SECONDS = 1;
const UPKEEP_SECONDS = 5;

/**
 * The service's jobs, kept in PostgreSQL by pg-boss (the embedded database too: the library reaches
 * it through the store's connection). Every process may add jobs, in the transaction of the request
 * that causes them; those that work jobs take them from the shared queue, so a job whose process died
 * is taken up by another once it expires.
 */
export class JobQueue {
  private readonly queues = new Set<string>();

  private constructor(
    private readonly boss: PgBoss,
    private readonly store: Store,
    private readonly watch?: JobWatch,
  ) {}

  /** Opens the queue (creating or updating the library's tables); `upkeep` also runs expiry and schedules here. */
  static async open(store: Store, options: { upkeep: boolean; watch?: JobWatch }): Promise<JobQueue> {
    const boss = new PgBoss({
      db: jobSql(store),
      supervise: options.upkeep,
      schedule: options.upkeep,
      maintenanceIntervalSeconds: UPKEEP_SECONDS,
      pollingIntervalSeconds: POLL_SECONDS,
      // Cron every minute at the finest; completed jobs kept a day for the counts.
      archiveCompletedAfterSeconds: 24 * 3600,
    });
    // The library reports its own failures (a lost connection while polling) and tries again itself.
    boss.on('error', () => {});
    await boss.start();
    return new JobQueue(boss, store, options.watch);
  }

  /** Creates the queue if new, else brings its settings up to date. */
  async define(spec: QueueSpec): Promise<void> {
    const options = { name: spec.name, retryLimit: spec.retryLimit, retryDelay: spec.retryDelaySeconds, retryBackoff: true, expireInSeconds: spec.expireInSeconds, ...(spec.deadLetter ? { deadLetter: spec.deadLetter } : {}) };
    await this.boss.createQueue(spec.name, options);
    await this.boss.updateQueue(spec.name, options);
    this.queues.add(spec.name);
  }

  /** Adds jobs in `db`'s transaction: they exist once it commits, and never if it rolls back. */
  async send(db: Kysely<Database>, queue: string, items: object[]): Promise<void> {
    if (items.length === 0) return;
    await this.boss.insert(items.map((data) => ({ name: queue, data })), { db: jobSql(this.store, db) });
  }

  /** Works the queue's jobs here, `concurrency` at a time; a handler that throws has its job tried again later. */
  async work<T>(queue: string, concurrency: number, handler: JobHandler<T>): Promise<void> {
    for (let i = 0; i < concurrency; i++) {
      await this.boss.work<T>(queue, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: POLL_SECONDS }, async ([job]) => {
        const started = performance.now();
        const seconds = () => (performance.now() - started) / 1000;
        try {
          await handler(job.data, { id: job.id, retryCount: job.retryCount, retryLimit: job.retryLimit });
          this.watch?.ended(queue, 'completed', seconds());
        } catch (error) {
          this.watch?.ended(queue, 'failed', seconds());
          throw error;
        }
      });
    }
  }

  /** Adds a job to the queue at each time of the cron expression (UTC), once across every process. */
  async schedule(queue: string, cron: string): Promise<void> {
    await this.boss.schedule(queue, cron);
  }

  /** How many jobs each queue defined here holds in each state (archived ones left out). */
  async counts(): Promise<Record<string, Record<JobState, number>>> {
    const { queues } = await (this.boss as PgBoss & { countStates(): Promise<{ queues: Record<string, Partial<Record<JobState, number>>> }> }).countStates();
    const statesOf = (name: string) => Object.fromEntries(JOB_STATES.map((state) => [state, queues[name]?.[state] ?? 0])) as Record<JobState, number>;
    return Object.fromEntries([...this.queues].map((name) => [name, statesOf(name)]));
  }

  /** Stops taking jobs and waits (up to `seconds`) for those under way; unfinished ones are failed, to be tried again. */
  async stop(seconds = 30): Promise<void> {
    await this.boss.stop({ graceful: true, wait: true, timeout: seconds * 1000 });
  }
}
