import type { Kysely } from 'kysely';
import type { JobQueue, QueueSpec } from '../jobs/job-queue.ts';
import type { Database } from '../store/database.ts';
import { deleteIdempotencyKeysOlderThan } from '../store/idempotency.ts';
import { deleteExpiredSectionFiles } from '../store/section-files.ts';
import { recordPassback } from '../store/passback.ts';
import { deleteExpiredSessions } from '../store/sessions.ts';
import { REGRADE_PARTS, REGRADE_PARTS_GIVEN_UP, type RegradePart, type Regrades } from './regrade.ts';
import { sectionStandings } from './report-inputs.ts';
import { SECTION_FILES, SECTION_FILES_GIVEN_UP, type SectionFileJob, type SectionFiles } from './section-files.ts';

/** Grades released in a section: what passback will send to a learning platform. */
export interface PassbackJob {
  assignmentId: number;
  sectionId: number;
}

export const PASSBACK: QueueSpec = { name: 'passback', retryLimit: 8, retryDelaySeconds: 30, expireInSeconds: 120 };
/** Expired browser sessions, old idempotency keys and expired section files, deleted on a schedule. */
export const CLEANUP: QueueSpec = { name: 'cleanup', retryLimit: 2, retryDelaySeconds: 60, expireInSeconds: 300 };
// Every quarter of an hour, once across all processes.
const CLEANUP_CRON = '*/15 * * * *';
/** How long a repeated Idempotency-Key still replays its first answer. */
export const IDEMPOTENCY_DAYS = 7;

/** Adds the passback of a section's released grades, in `db`'s transaction (the release's). */
export function queuePassback(queue: JobQueue, db: Kysely<Database>, job: PassbackJob): Promise<void> {
  return queue.send(db, PASSBACK.name, [job]);
}

/**
 * Records what passback would send: each student's released score. A stub until a platform is
 * connected; then this job sends, and the queue tries it again until the platform answers.
 */
async function passback(db: Kysely<Database>, { assignmentId, sectionId }: PassbackJob): Promise<void> {
  const grades = (await sectionStandings(db, sectionId, assignmentId)).flatMap((row) =>
    row.released?.releasedAt ? [{ studentId: row.studentId, score: row.released.score, maxScore: row.released.maxScore, releasedAt: row.released.releasedAt.toISOString() }] : [],
  );
  await recordPassback(db, assignmentId, sectionId, grades);
}

async function cleanUp(db: Kysely<Database>): Promise<void> {
  await deleteExpiredSessions(db);
  await deleteIdempotencyKeysOlderThan(db, IDEMPOTENCY_DAYS);
  await deleteExpiredSectionFiles(db);
}

/** Creates the service's queues; `work` also takes their jobs here, `concurrency` regrade parts at a time, and keeps the cleanup's schedule. */
export async function startServiceJobs(queue: JobQueue, options: { db: Kysely<Database>; regrades: Regrades; sectionFiles: SectionFiles; work: boolean; concurrency: number }): Promise<void> {
  // A dead-letter queue exists before the queue that names it.
  for (const spec of [REGRADE_PARTS_GIVEN_UP, REGRADE_PARTS, SECTION_FILES_GIVEN_UP, SECTION_FILES, PASSBACK, CLEANUP]) await queue.define(spec);
  if (!options.work) return;
  const { db, regrades, sectionFiles } = options;
  await queue.work<RegradePart>(REGRADE_PARTS.name, options.concurrency, (part) => regrades.runPart(db, part));
  await queue.work<RegradePart>(REGRADE_PARTS_GIVEN_UP.name, 1, (part) => regrades.giveUp(db, part));
  // One file at a time: drawing one already keeps the worker pool busy.
  await queue.work<SectionFileJob>(SECTION_FILES.name, 1, (job) => sectionFiles.draw(db, job));
  await queue.work<SectionFileJob>(SECTION_FILES_GIVEN_UP.name, 1, (job) => sectionFiles.giveUp(db, job));
  await queue.work<PassbackJob>(PASSBACK.name, 1, (job) => passback(db, job));
  await queue.work<object>(CLEANUP.name, 1, () => cleanUp(db));
  await queue.schedule(CLEANUP.name, CLEANUP_CRON);
}
