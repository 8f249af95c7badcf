import { randomUUID } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { AssignmentRow } from '../store/assignments.ts';
import type { Database } from '../store/database.ts';
import { completeRegradePart, createRegrade, failRegrade, getRegrade, latestRegrade, regradePartToDo, type RegradeRow } from '../store/regrades.ts';
import { insertResults, submissionsByIds } from '../store/submissions.ts';
import type { JobQueue, QueueSpec } from '../jobs/job-queue.ts';
import { assignmentOf } from './assignment-of.ts';
import type { Grader } from './grader.ts';
import { gradedWithLatePolicy, latePolicyOf } from './late-work.ts';

/** One part of a regrade: the job's data. */
export interface RegradePart {
  regradeId: string;
  part: number;
}

// A part is one task of the worker pool (it checks 250 at a time) and one transaction.
const PART = 250;

/** A part's job: tried again with growing waits; one running 20 s is taken to have lost its process. */
export const REGRADE_PARTS: QueueSpec = { name: 'regrade-part', retryLimit: 5, retryDelaySeconds: 2, expireInSeconds: 20, deadLetter: 'regrade-part-given-up' };
/** Parts whose tries are used up come here, to stop their regrade with a reason. */
export const REGRADE_PARTS_GIVEN_UP: QueueSpec = { name: 'regrade-part-given-up', retryLimit: 3, retryDelaySeconds: 5, expireInSeconds: 60 };

const GIVEN_UP = 'a part could not be stored after several tries; the results stored before stay, and starting the regrade again is safe';

/**
 * Regrades as jobs: a regrade is recorded with its submissions in parts, and one job per part is
 * added, all in the transaction of the request that starts it. Any process that works jobs takes
 * parts; each part is checked, then stored and marked done in one transaction, so a part done twice
 * stores nothing twice. New results are added; earlier ones and what was released stay.
 */
export class Regrades {
  constructor(
    private readonly grader: Grader,
    private readonly queue: JobQueue,
  ) {}

  /** Records a regrade under the assignment's current settings and queues its parts, in `db`'s transaction. */
  async start(db: Kysely<Database>, assignment: AssignmentRow, sectionId?: number): Promise<RegradeRow> {
    assignmentOf(assignment.settings, 'settings');
    const { row, parts } = await createRegrade(db, { id: randomUUID(), assignmentId: assignment.id, sectionId, settings: assignment.settings, settingsVersion: assignment.settingsVersion, partSize: PART });
    await this.queue.send(db, REGRADE_PARTS.name, parts.map((part): RegradePart => ({ regradeId: row.regradeId, part })));
    return row;
  }

  get(db: Kysely<Database>, regradeId: string): Promise<RegradeRow | undefined> {
    return getRegrade(db, regradeId);
  }

  latest(db: Kysely<Database>, assignmentId: number): Promise<RegradeRow | undefined> {
    return latestRegrade(db, assignmentId);
  }

  /** Does one part, unless it is done already (or its regrade stopped). */
  async runPart(db: Kysely<Database>, { regradeId, part }: RegradePart): Promise<void> {
    const todo = await regradePartToDo(db, regradeId, part);
    if (!todo) return;
    // Checked outside the transaction, which then holds its locks only while it stores.
    const submissions = await submissionsByIds(db, todo.submissionIds);
    const graded = await this.grader.check(todo.settings, submissions.map((s) => s.payload));
    await db.transaction().execute(async (trx) => {
      // Another process may have done the part meanwhile (this job expired and was taken up): then nothing is stored.
      if (!(await regradePartToDo(trx, regradeId, part, true))) return;
      // Late work stays late under the settings regraded with: the late-work setting is applied afresh.
      const late = latePolicyOf(todo.settings);
      await insertResults(trx, { settings: todo.settings, settingsVersion: todo.settingsVersion }, submissions.map((s, i) => ({ submissionId: s.submissionId, result: gradedWithLatePolicy(graded[i], late, s.late) })));
      await completeRegradePart(trx, regradeId, part, submissions.length);
    });
  }

  /** A part given up on stops its regrade, saying why. */
  async giveUp(db: Kysely<Database>, { regradeId }: RegradePart): Promise<void> {
    await failRegrade(db, regradeId, GIVEN_UP);
  }
}
