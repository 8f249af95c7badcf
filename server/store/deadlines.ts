import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';

/** A section's deadline for an assignment, with who set it; undefined when none is set. */
export async function deadlineOf(db: Kysely<Database>, assignmentId: number, sectionId: number) {
  return db
    .selectFrom('deadlines')
    .innerJoin('staff', 'staff.id', 'deadlines.set_by')
    .select(['deadlines.due_at as dueAt', 'staff.handle as setBy', 'deadlines.set_at as setAt'])
    .where('deadlines.assignment_id', '=', assignmentId)
    .where('deadlines.section_id', '=', sectionId)
    .executeTakeFirst();
}

/** Sets (or, with null, clears) a section's deadline for an assignment; earlier submissions keep their late mark. */
export async function setDeadline(db: Kysely<Database>, assignmentId: number, sectionId: number, dueAt: Date | null, staffId: number): Promise<void> {
  if (dueAt === null) {
    await db.deleteFrom('deadlines').where('assignment_id', '=', assignmentId).where('section_id', '=', sectionId).execute();
    return;
  }
  await db
    .insertInto('deadlines')
    .values({ assignment_id: assignmentId, section_id: sectionId, due_at: dueAt, set_by: staffId })
    .onConflict((oc) => oc.columns(['assignment_id', 'section_id']).doUpdateSet({ due_at: dueAt, set_by: staffId, set_at: sql<Date>`now()` }))
    .execute();
}

/**
 * Whether a submission stored now (the transaction's time, which its `created_at` takes) is past the
 * section's deadline: the database's clock decides, so that the mark and the stored time agree.
 */
export async function pastDeadline(db: Kysely<Database>, assignmentId: number, sectionId: number): Promise<boolean> {
  const row = await db
    .selectFrom('deadlines')
    .select(sql<boolean>`due_at < now()`.as('past'))
    .where('assignment_id', '=', assignmentId)
    .where('section_id', '=', sectionId)
    .executeTakeFirst();
  return row?.past === true;
}
