import { randomUUID } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { AssignmentRow } from '../store/assignments.ts';
import type { Database } from '../store/database.ts';
import { insertResults, latestSubmissions } from '../store/submissions.ts';
import { inParts } from '../store/in-parts.ts';
import { isDatabaseUnavailable } from '../store/unavailable.ts';
import { assignmentOf } from './assignment-of.ts';
import type { Grader } from './grader.ts';

/** Where a regrade stands: how many of its submissions have new results. */
export interface RegradeProgress {
  regradeId: string;
  assignmentId: number;
  sectionId: number | null;
  total: number;
  done: number;
  status: 'running' | 'finished' | 'failed';
  /** Why it stopped, when it failed; the results stored before that stay. */
  error?: string;
  startedAt: Date;
  finishedAt?: Date;
}

/** Told when a regrade starts and ends (the metrics count them). */
export interface RegradeWatch {
  started(): void;
  ended(job: Readonly<RegradeProgress>): void;
}

// Each part is checked in the workers and stored in a transaction of its own, so that progress shows
// and no transaction holds thousands of rows.
const PART = 500;
const KEPT = 100;

/**
 * The regrades of one service: each runs in the background, part by part, and can be asked how far it
 * is. New results are added; earlier ones stay. Kept in memory: a regrade cut short by a restart is
 * simply started again (it only adds results).
 */
export class Regrades {
  private readonly jobs = new Map<string, RegradeProgress>();
  private readonly running = new Set<Promise<void>>();

  constructor(
    private readonly grader: Grader,
    private readonly watch?: RegradeWatch,
  ) {}

  async start(db: Kysely<Database>, assignment: AssignmentRow, sectionId?: number): Promise<RegradeProgress> {
    assignmentOf(assignment.settings, 'settings');
    const latest = await latestSubmissions(db, assignment.id, sectionId);
    const job: RegradeProgress = { regradeId: randomUUID(), assignmentId: assignment.id, sectionId: sectionId ?? null, total: latest.length, done: 0, status: 'running', startedAt: new Date() };
    this.keep(job);
    this.watch?.started();
    const work = this.run(db, assignment, latest, job).finally(() => this.running.delete(work));
    this.running.add(work);
    return { ...job };
  }

  get(regradeId: string): RegradeProgress | undefined {
    const job = this.jobs.get(regradeId);
    return job && { ...job };
  }

  /** Waits for the regrades under way (before the service closes its database). */
  async idle(): Promise<void> {
    await Promise.allSettled([...this.running]);
  }

  private keep(job: RegradeProgress): void {
    this.jobs.set(job.regradeId, job);
    if (this.jobs.size > KEPT) this.jobs.delete(this.jobs.keys().next().value!);
  }

  private async run(db: Kysely<Database>, assignment: AssignmentRow, latest: Array<{ submissionId: number; payload: unknown }>, job: RegradeProgress): Promise<void> {
    const gradedWith = { settings: assignment.settings, settingsVersion: assignment.settingsVersion };
    try {
      for (const part of inParts(latest, PART)) {
        const graded = await this.grader.check(assignment.settings, part.map((s) => s.payload));
        await db.transaction().execute((trx) => insertResults(trx, gradedWith, part.map((s, j) => ({ submissionId: s.submissionId, result: graded[j] }))));
        job.done += part.length;
      }
      job.status = 'finished';
    } catch (error) {
      job.status = 'failed';
      job.error = isDatabaseUnavailable(error) ? 'the database could not be reached; start the regrade again' : 'an internal error stopped it; start the regrade again';
    } finally {
      job.finishedAt = new Date();
      this.watch?.ended(job);
    }
  }
}
