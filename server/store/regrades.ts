import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';
import { inParts } from './in-parts.ts';
import { latestSubmissionIds } from './submissions.ts';

/** A regrade as stored: how many of its submissions have new results. */
export interface RegradeRow {
  regradeId: string;
  assignmentId: number;
  sectionId: number | null;
  total: number;
  done: number;
  status: 'running' | 'finished' | 'failed';
  error: string | null;
  startedAt: Date;
  finishedAt: Date | null;
}

const columns = [
  'id as regradeId',
  'assignment_id as assignmentId',
  'section_id as sectionId',
  'total',
  'done',
  'status',
  'error',
  'started_at as startedAt',
  'finished_at as finishedAt',
] as const;

/**
 * Records a regrade of the latest submissions (one section or all) under the given settings, its
 * submissions cut into parts fixed now; in the caller's transaction. Returns the regrade and its parts' numbers.
 */
export async function createRegrade(
  db: Kysely<Database>,
  regrade: { id: string; assignmentId: number; sectionId?: number; settings: unknown; settingsVersion: number; partSize: number },
): Promise<{ row: RegradeRow; parts: number[] }> {
  const ids = await latestSubmissionIds(db, regrade.assignmentId, regrade.sectionId);
  const row = await db
    .insertInto('regrades')
    .values({
      id: regrade.id,
      assignment_id: regrade.assignmentId,
      section_id: regrade.sectionId ?? null,
      settings: JSON.stringify(regrade.settings),
      settings_version: regrade.settingsVersion,
      total: ids.length,
      // Nothing to regrade is a regrade already finished.
      ...(ids.length === 0 ? { status: 'finished' as const, finished_at: sql<Date>`now()` } : {}),
      error: null,
    })
    .returning(columns)
    .executeTakeFirstOrThrow();
  const parts = inParts(ids, regrade.partSize).map((submissionIds, part) => ({ regrade_id: regrade.id, part, submission_ids: JSON.stringify(submissionIds) }));
  for (const chunk of inParts(parts, 1000)) await db.insertInto('regrade_parts').values(chunk).execute();
  return { row, parts: parts.map((p) => p.part) };
}

export async function getRegrade(db: Kysely<Database>, regradeId: string): Promise<RegradeRow | undefined> {
  return db.selectFrom('regrades').select(columns).where('id', '=', regradeId).executeTakeFirst();
}

/** The assignment's regrade started last (of one section or all), if any: what a reloaded page follows. */
export async function latestRegrade(db: Kysely<Database>, assignmentId: number): Promise<RegradeRow | undefined> {
  return db.selectFrom('regrades').select(columns).where('assignment_id', '=', assignmentId).orderBy('started_at', 'desc').orderBy('id', 'desc').limit(1).executeTakeFirst();
}

/** What one part of a regrade applies to which submissions, while it is still to do (undefined once done or failed). */
export async function regradePartToDo(db: Kysely<Database>, regradeId: string, part: number, lock = false) {
  let query = db
    .selectFrom('regrade_parts')
    .innerJoin('regrades', 'regrades.id', 'regrade_parts.regrade_id')
    .select(['regrade_parts.submission_ids as submissionIds', 'regrades.settings as settings', 'regrades.settings_version as settingsVersion'])
    .where('regrade_parts.regrade_id', '=', regradeId)
    .where('regrade_parts.part', '=', part)
    .where('regrade_parts.done_at', 'is', null)
    .where('regrades.status', '=', 'running');
  // Locking the part makes a second worker on it wait for the first's transaction, then find it done.
  if (lock) query = query.forUpdate(['regrade_parts']);
  return query.executeTakeFirst();
}

/** Marks a part done and counts its submissions into the regrade, finishing it with its last part; in the part's transaction. */
export async function completeRegradePart(db: Kysely<Database>, regradeId: string, part: number, count: number): Promise<void> {
  await db.updateTable('regrade_parts').set({ done_at: sql<Date>`now()` }).where('regrade_id', '=', regradeId).where('part', '=', part).execute();
  await db
    .updateTable('regrades')
    .set((eb) => ({
      done: eb('done', '+', count),
      status: sql<'running' | 'finished'>`case when done + ${count} >= total then 'finished' else status end`,
      finished_at: sql<Date | null>`case when done + ${count} >= total then now() else finished_at end`,
    }))
    .where('id', '=', regradeId)
    .execute();
}

/** Stops a running regrade with the reason; the parts done before stay. */
export async function failRegrade(db: Kysely<Database>, regradeId: string, error: string): Promise<void> {
  await db.updateTable('regrades').set({ status: 'failed', error, finished_at: sql<Date>`now()` }).where('id', '=', regradeId).where('status', '=', 'running').execute();
}
