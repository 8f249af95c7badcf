import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

export interface RosterEntry {
  studentId: string;
  displayName?: string;
}

/** Students of a course already placed in another section: each may be in one section per course. */
export async function studentsElsewhere(db: Kysely<Database>, courseId: number, sectionId: number, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .selectFrom('students')
    .select(['student_id as studentId', 'section_id as sectionId'])
    .where('course_id', '=', courseId)
    .where('section_id', '!=', sectionId)
    .where('student_id', 'in', ids)
    .execute();
}

export async function addToRoster(db: Kysely<Database>, courseId: number, sectionId: number, entries: RosterEntry[]): Promise<number> {
  if (entries.length === 0) return 0;
  const rows = await db
    .insertInto('students')
    .values(entries.map((e) => ({ course_id: courseId, section_id: sectionId, student_id: e.studentId, display_name: e.displayName ?? null })))
    .onConflict((oc) => oc.columns(['course_id', 'student_id']).doUpdateSet((eb) => ({ display_name: eb.ref('excluded.display_name') })))
    .returning('id')
    .execute();
  return rows.length;
}

export async function listRoster(db: Kysely<Database>, sectionId: number) {
  return db
    .selectFrom('students')
    .select(['student_id as studentId', 'display_name as displayName'])
    .where('section_id', '=', sectionId)
    .orderBy('student_id')
    .execute();
}

/** Row ids of the given pseudonymous ids on a section's roster. */
export async function rosterRows(db: Kysely<Database>, sectionId: number, ids: string[]): Promise<Map<string, number>> {
  if (ids.length === 0) return new Map();
  const rows = await db.selectFrom('students').select(['id', 'student_id']).where('section_id', '=', sectionId).where('student_id', 'in', ids).execute();
  return new Map(rows.map((r) => [r.student_id, r.id]));
}

/** Roster students of a section with no submission to an assignment: a gradebook lists them too. */
export async function studentsWithoutSubmission(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<string[]> {
  const rows = await db
    .selectFrom('students')
    .select('student_id')
    .where('section_id', '=', sectionId)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom('submissions').select('submissions.id').whereRef('submissions.student_row_id', '=', 'students.id').where('submissions.assignment_id', '=', assignmentId))),
    )
    .orderBy('student_id')
    .execute();
  return rows.map((r) => r.student_id);
}
