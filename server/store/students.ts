import { sql, type Kysely } from 'kysely';
import type { Database, EnrolmentStatus } from './database.ts';

export interface RosterEntry {
  studentId: string;
  displayName?: string;
}

/** Student ids are compared without regard to case (`A-01` and `a-01` are one student); the key they are compared by. */
export const idKey = (studentId: string): string => studentId.toLowerCase();

/** Students of a course already placed in another section (ids in any case): each may be in one section per course. */
export async function studentsElsewhere(db: Kysely<Database>, courseId: number, sectionId: number, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .selectFrom('students')
    .select(['student_id as studentId', 'section_id as sectionId'])
    .where('course_id', '=', courseId)
    .where('section_id', '!=', sectionId)
    .where(sql`lower(student_id)`, 'in', ids.map(idKey))
    .execute();
}

async function recordEvents(db: Kysely<Database>, rows: Array<{ id: number }>, status: EnrolmentStatus, staffId: number | null): Promise<void> {
  if (rows.length === 0) return;
  await db.insertInto('roster_events').values(rows.map((r) => ({ student_row_id: r.id, status, staff_id: staffId }))).execute();
}

/** What adding to a roster did: students new to it, students enrolled again after leaving, and students already enrolled. */
export interface RosterAdded {
  added: number;
  reenrolled: number;
  alreadyEnrolled: number;
}

/**
 * Adds students to a section, or enrols again those withdrawn or removed; each change of enrolment is
 * recorded. A display name given replaces the one kept; none given keeps it. The entries must spell
 * each id as the roster does (see `rosterRows`), which the caller checks.
 */
/** Adds students to a section's roster; `before` is what `rosterRows` read of them in the same transaction. */
export async function addToRoster(db: Kysely<Database>, section: { id: number; courseId: number }, entries: RosterEntry[], before: RosterRows, staffId: number | null): Promise<RosterAdded> {
  if (entries.length === 0) return { added: 0, reenrolled: 0, alreadyEnrolled: 0 };
  const [courseId, sectionId] = [section.courseId, section.id];
  const rows = await db
    .insertInto('students')
    .values(entries.map((e) => ({ course_id: courseId, section_id: sectionId, student_id: e.studentId, display_name: e.displayName ?? null })))
    .onConflict((oc) =>
      oc.columns(['course_id', 'student_id']).doUpdateSet((eb) => ({ display_name: eb.fn.coalesce(eb.ref('excluded.display_name'), eb.ref('students.display_name')), status: 'enrolled' })),
    )
    .returning(['id', 'student_id'])
    .execute();
  await recordEvents(db, rows.filter((r) => before.get(r.student_id)?.status !== 'enrolled'), 'enrolled', staffId);
  const statuses = entries.map((e) => before.get(e.studentId)?.status);
  return {
    added: statuses.filter((s) => s === undefined).length,
    reenrolled: statuses.filter((s) => s === 'withdrawn' || s === 'removed').length,
    alreadyEnrolled: statuses.filter((s) => s === 'enrolled').length,
  };
}

/** Marks a roster student enrolled, withdrawn or removed; undefined when they are not on the roster. */
export async function setEnrolment(db: Kysely<Database>, sectionId: number, studentId: string, status: EnrolmentStatus, staffId: number | null) {
  const row = await db.updateTable('students').set({ status }).where('section_id', '=', sectionId).where(sql`lower(student_id)`, '=', idKey(studentId)).returning(['id']).executeTakeFirst();
  if (row) await recordEvents(db, [row], status, staffId);
  return row;
}

/** A section's roster with each student's enrolment history, or one student's entry. */
export async function listRoster(db: Kysely<Database>, sectionId: number, studentId?: string) {
  let query = db.selectFrom('students').select(['id', 'student_id as studentId', 'display_name as displayName', 'status']).where('section_id', '=', sectionId);
  if (studentId !== undefined) query = query.where(sql`lower(student_id)`, '=', idKey(studentId));
  const students = await query.orderBy('student_id').execute();
  const events = students.length
    ? await db
        .selectFrom('roster_events')
        .leftJoin('staff', 'staff.id', 'roster_events.staff_id')
        .select(['roster_events.student_row_id as rowId', 'roster_events.status as status', 'staff.handle as by', 'roster_events.at as at'])
        .where('roster_events.student_row_id', 'in', students.map((s) => s.id))
        .orderBy('roster_events.id')
        .execute()
    : [];
  return students.map(({ id, ...s }) => ({ ...s, history: events.filter((e) => e.rowId === id).map(({ rowId: _, ...e }) => e) }));
}

/**
 * Row ids, enrolment and the roster's own spelling of the given pseudonymous ids on a section's
 * roster, keyed by the ids as given: an id matches the roster's student whatever its case.
 */
export type RosterRows = Map<string, { id: number; status: EnrolmentStatus; studentId: string }>;

export async function rosterRows(db: Kysely<Database>, sectionId: number, ids: string[]): Promise<RosterRows> {
  if (ids.length === 0) return new Map();
  const rows = await db
    .selectFrom('students')
    .select(['id', 'student_id', 'status'])
    .where('section_id', '=', sectionId)
    .where(sql`lower(student_id)`, 'in', [...new Set(ids.map(idKey))])
    .execute();
  const byKey = new Map(rows.map((r) => [idKey(r.student_id), { id: r.id, status: r.status, studentId: r.student_id }]));
  return new Map(ids.flatMap((id) => (byKey.has(idKey(id)) ? [[id, byKey.get(idKey(id))!] as const] : [])));
}

/** Roster students (enrolled or withdrawn) with no submission to an assignment: a gradebook lists them too. */
export async function studentsWithoutSubmission(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<Array<{ studentId: string; status: EnrolmentStatus }>> {
  const rows = await db
    .selectFrom('students')
    .select(['student_id as studentId', 'status'])
    .where('section_id', '=', sectionId)
    .where('status', '!=', 'removed')
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom('submissions').select('submissions.id').whereRef('submissions.student_row_id', '=', 'students.id').where('submissions.assignment_id', '=', assignmentId))),
    )
    .orderBy('student_id')
    .execute();
  return rows;
}

/** The pseudonymous ids of a section's withdrawn students. */
export async function withdrawnStudents(db: Kysely<Database>, sectionId: number): Promise<string[]> {
  const rows = await db.selectFrom('students').select('student_id').where('section_id', '=', sectionId).where('status', '=', 'withdrawn').execute();
  return rows.map((r) => r.student_id);
}
