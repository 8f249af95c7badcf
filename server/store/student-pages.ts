import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** What the students' pages read of the store: always by the student's own row, never by a URL's student. */

/** The student with their course and section, by their row; undefined when they are no longer enrolled. */
export async function enrolledStudent(db: Kysely<Database>, studentRowId: number) {
  return db
    .selectFrom('students')
    .innerJoin('courses', 'courses.id', 'students.course_id')
    .innerJoin('sections', 'sections.id', 'students.section_id')
    .select([
      'students.student_id as studentId',
      'students.display_name as displayName',
      'courses.id as courseId',
      'courses.name as courseName',
      'sections.id as sectionId',
      'sections.name as sectionName',
    ])
    .where('students.id', '=', studentRowId)
    .where('students.status', '=', 'enrolled')
    .executeTakeFirst();
}

/** The course's assignments with the section's deadline for each (null: none), in the order they were made. */
export async function assignmentsWithDeadlines(db: Kysely<Database>, courseId: number, sectionId: number) {
  return db
    .selectFrom('assignments')
    .leftJoin('deadlines', (join) => join.onRef('deadlines.assignment_id', '=', 'assignments.id').on('deadlines.section_id', '=', sectionId))
    .select(['assignments.id', 'assignments.title', 'assignments.kind', 'assignments.settings', 'deadlines.due_at as dueAt'])
    .where('assignments.course_id', '=', courseId)
    .orderBy('assignments.id')
    .execute();
}

/** Every version the student submitted, to every assignment, oldest first. */
export async function ownVersions(db: Kysely<Database>, studentRowId: number) {
  return db
    .selectFrom('submissions')
    .select(['assignment_id as assignmentId', 'version', 'created_at as submittedAt', 'late', 'held'])
    .where('student_row_id', '=', studentRowId)
    .orderBy('assignment_id')
    .orderBy('version')
    .execute();
}

/** The student's latest release per assignment (the one they are shown) and when they first opened it. */
export async function ownReleases(db: Kysely<Database>, studentRowId: number) {
  return db
    .selectFrom('releases')
    .innerJoin('submissions', 'submissions.id', 'releases.submission_id')
    .leftJoin('feedback_reads', 'feedback_reads.release_id', 'releases.id')
    .distinctOn('submissions.assignment_id')
    .select(['submissions.assignment_id as assignmentId', 'submissions.version', 'releases.released_at as releasedAt', 'feedback_reads.first_read_at as firstReadAt'])
    .where('submissions.student_row_id', '=', studentRowId)
    .orderBy('submissions.assignment_id')
    .orderBy('releases.id', 'desc')
    .execute();
}

/** The first time the student opens a release is kept; opening it again changes nothing. */
export async function recordFeedbackRead(db: Kysely<Database>, releaseId: number, studentRowId: number): Promise<void> {
  await db.insertInto('feedback_reads').values({ release_id: releaseId, student_row_id: studentRowId }).onConflict((oc) => oc.column('release_id').doNothing()).execute();
}
