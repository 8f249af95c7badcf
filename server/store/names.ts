import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** The names a report's header shows: course, section and assignment. */
export async function reportNames(db: Kysely<Database>, sectionId: number, assignmentId: number) {
  return db
    .selectFrom('sections')
    .innerJoin('courses', 'courses.id', 'sections.course_id')
    .innerJoin('assignments', 'assignments.course_id', 'courses.id')
    .select(['courses.name as course', 'sections.name as section', 'assignments.title as assignment'])
    .where('sections.id', '=', sectionId)
    .where('assignments.id', '=', assignmentId)
    .executeTakeFirstOrThrow();
}
