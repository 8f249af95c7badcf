import { sql, type Kysely } from 'kysely';

/**
 * Each student's latest version of each assignment and its latest result, kept by the store in the
 * transaction that stores a result, so that a section's results page reads one row per student by
 * key instead of searching every version and result. Students get an index by section for the same
 * page. Filled here from the versions and results stored so far.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('latest_results')
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('submission_id', 'integer', (c) => c.notNull().references('submissions.id'))
    .addColumn('version', 'integer', (c) => c.notNull())
    .addColumn('result_id', 'integer', (c) => c.notNull().references('results.id'))
    .addPrimaryKeyConstraint('latest_results_key', ['assignment_id', 'student_row_id'])
    .execute();
  await db.schema.createIndex('students_section').on('students').columns(['section_id', 'student_id']).execute();
  await sql`
    INSERT INTO latest_results (assignment_id, student_row_id, submission_id, version, result_id)
    SELECT DISTINCT ON (s.assignment_id, s.student_row_id) s.assignment_id, s.student_row_id, s.id, s.version, r.id
    FROM submissions s JOIN results r ON r.submission_id = s.id
    ORDER BY s.assignment_id, s.student_row_id, s.version DESC, r.id DESC`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropIndex('students_section').execute();
  await db.schema.dropTable('latest_results').execute();
}
