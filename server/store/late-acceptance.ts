import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';

/** A submission's late mark and, where a TA accepted it, who and when. */
export async function lateStanding(db: Kysely<Database>, submissionId: number) {
  return db
    .selectFrom('submissions')
    .leftJoin('staff', 'staff.id', 'submissions.late_accepted_by')
    .select(['submissions.id as submissionId', 'submissions.late', 'submissions.held', 'staff.handle as acceptedBy', 'submissions.late_accepted_at as acceptedAt'])
    .where('submissions.id', '=', submissionId)
    .executeTakeFirstOrThrow();
}

/** Accepts a held submission: it takes part in the next release; the first acceptance is the one recorded. */
export async function acceptLate(db: Kysely<Database>, submissionId: number, staffId: number): Promise<void> {
  await db
    .updateTable('submissions')
    .set({ held: false, late_accepted_by: staffId, late_accepted_at: sql<Date>`now()` })
    .where('id', '=', submissionId)
    .where('held', '=', true)
    .execute();
}
