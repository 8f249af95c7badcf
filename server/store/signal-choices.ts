import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** Every TA choice to put a signal on a sheet or take it off, oldest first: the trail and its latest state. */
export async function signalChoicesOf(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return db
    .selectFrom('signal_choices')
    .innerJoin('staff', 'staff.id', 'signal_choices.staff_id')
    .select([
      'signal_choices.id as id',
      'signal_choices.submission_id as submissionId',
      'signal_choices.code as code',
      'signal_choices.path as path',
      'signal_choices.on_sheet as onSheet',
      'staff.handle as by',
      'signal_choices.created_at as at',
    ])
    .where('signal_choices.submission_id', 'in', submissionIds)
    .orderBy('signal_choices.id')
    .execute();
}

export type SignalChoiceRow = Awaited<ReturnType<typeof signalChoicesOf>>[number];

export async function insertSignalChoice(db: Kysely<Database>, c: { submissionId: number; code: string; path: string; onSheet: boolean; staffId: number }) {
  await db.insertInto('signal_choices').values({ submission_id: c.submissionId, code: c.code, path: c.path, on_sheet: c.onSheet, staff_id: c.staffId }).execute();
}
