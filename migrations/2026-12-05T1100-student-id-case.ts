import { sql, type Kysely } from 'kysely';

/**
 * Student ids are compared without regard to case: `A-01` and `a-01` are one student, so a course may
 * not hold both. Rows that already differ only in case cannot be merged here (each may have its own
 * submissions): the migration stops, changing nothing, and names them by their internal row ids so
 * that an administrator can rename or merge them first.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  const { rows } = await sql<{ rowIds: number[] }>`
    select array_agg(id order by id) as "rowIds" from students group by course_id, lower(student_id) having count(*) > 1
  `.execute(db);
  if (rows.length > 0) {
    const groups = rows.map((r) => r.rowIds.join(' and ')).join('; ');
    throw new Error(`student ids that differ only in case are one student, yet ${rows.length} course roster(s) hold such ids twice (student rows ${groups}); rename or merge them, then migrate again`);
  }
  await sql`create unique index students_course_student_any_case on students (course_id, lower(student_id))`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`drop index students_course_student_any_case`.execute(db);
}
