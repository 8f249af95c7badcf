import type { Kysely } from 'kysely';
import type { JobQueue, QueueSpec } from '../jobs/job-queue.ts';
import type { Database } from '../store/database.ts';
import { deleteIdempotencyKeysOlderThan } from '../store/idempotency.ts';
import { deleteExpiredSectionFiles } from '../store/section-files.ts';
import { markReleasedForSending, retryFailedSends } from '../store/grade-sends.ts';
import { deleteExpiredSessions } from '../store/sessions.ts';
import { giveUpPassback, sendReleasedGrades, type PassbackJob } from './grade-passback.ts';
import { REGRADE_PARTS, REGRADE_PARTS_GIVEN_UP, type RegradePart, type Regrades } from './regrade.ts';
import { SECTION_FILES, SECTION_FILES_GIVEN_UP, type SectionFileJob, type SectionFiles } from './section-files.ts';

/**
 * Grade passback to learning platforms: tried again with a doubling wait from `retryDelaySeconds`, so
 * 8 tries after the first wait about 4 hours in all before the sends still waiting are given up.
 */
export const PASSBACK_GIVEN_UP: QueueSpec = { name: 'passback-given-up', retryLimit: 3, retryDelaySeconds: 60, expireInSeconds: 60 };
export const PASSBACK: QueueSpec = { name: 'passback', retryLimit: 8, retryDelaySeconds: 30, expireInSeconds: 300, deadLetter: PASSBACK_GIVEN_UP.name };
/** The passback queue, its first wait changed where the service is configured so (a test's platform outage lasts seconds). */
const passbackSpec = (retrySeconds: number | undefined): QueueSpec => (retrySeconds === undefined ? PASSBACK : { ...PASSBACK, retryDelaySeconds: retrySeconds });

/** Expired browser sessions, old idempotency keys and expired section files, deleted on a schedule. */
export const CLEANUP: QueueSpec = { name: 'cleanup', retryLimit: 2, retryDelaySeconds: 60, expireInSeconds: 300 };
// Every quarter of an hour, once across all processes.
const CLEANUP_CRON = '*/15 * * * *';
/** How long a repeated Idempotency-Key still replays its first answer. */
export const IDEMPOTENCY_DAYS = 7;

/**
 * Marks the grades just released (`submissionIds`) to be sent to the students' learning platforms and
 * queues their passback, in `db`'s transaction (the release's): nothing is queued for students no
 * platform knows.
 */
export async function queuePassback(queue: JobQueue, db: Kysely<Database>, job: PassbackJob, submissionIds: number[]): Promise<void> {
  if ((await markReleasedForSending(db, job.assignmentId, submissionIds)) > 0) await queue.send(db, PASSBACK.name, [job]);
}

/** Makes a section's failed grade sends wait again and queues their passback; how many wait. */
export async function sendFailedAgain(queue: JobQueue, db: Kysely<Database>, job: PassbackJob): Promise<number> {
  const waiting = await retryFailedSends(db, job.assignmentId, job.sectionId);
  if (waiting > 0) await queue.send(db, PASSBACK.name, [job]);
  return waiting;
}

async function cleanUp(db: Kysely<Database>): Promise<void> {
  await deleteExpiredSessions(db);
  await deleteIdempotencyKeysOlderThan(db, IDEMPOTENCY_DAYS);
  await deleteExpiredSectionFiles(db);
}

/** Creates the service's queues; `work` also takes their jobs here, `concurrency` regrade parts at a time, and keeps the cleanup's schedule. */
export async function startServiceJobs(queue: JobQueue, options: { db: Kysely<Database>; regrades: Regrades; sectionFiles: SectionFiles; work: boolean; concurrency: number; passbackRetrySeconds?: number }): Promise<void> {
  // A dead-letter queue exists before the queue that names it.
  for (const spec of [REGRADE_PARTS_GIVEN_UP, REGRADE_PARTS, SECTION_FILES_GIVEN_UP, SECTION_FILES, PASSBACK_GIVEN_UP, passbackSpec(options.passbackRetrySeconds), CLEANUP]) await queue.define(spec);
  if (!options.work) return;
  const { db, regrades, sectionFiles } = options;
  await queue.work<RegradePart>(REGRADE_PARTS.name, options.concurrency, (part) => regrades.runPart(db, part));
  await queue.work<RegradePart>(REGRADE_PARTS_GIVEN_UP.name, 1, (part) => regrades.giveUp(db, part));
  // One file at a time: drawing one already keeps the worker pool busy.
  await queue.work<SectionFileJob>(SECTION_FILES.name, 1, (job) => sectionFiles.draw(db, job));
  await queue.work<SectionFileJob>(SECTION_FILES_GIVEN_UP.name, 1, (job) => sectionFiles.giveUp(db, job));
  await queue.work<PassbackJob>(PASSBACK.name, 1, (job) => sendReleasedGrades(db, job));
  await queue.work<PassbackJob>(PASSBACK_GIVEN_UP.name, 1, (job) => giveUpPassback(db, job));
  await queue.work<object>(CLEANUP.name, 1, () => cleanUp(db));
  await queue.schedule(CLEANUP.name, CLEANUP_CRON);
}
