import { sql, type Kysely } from 'kysely';

/**
 * Students' own door: access codes a student signs in with (stored only as hashes, one live code per
 * student), their browser sessions, a deadline per assignment and section, whether each submission
 * came from the student and came late (and, under the hold policy, whether a TA has accepted it), and
 * the first time a student opened each release of their feedback.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('access_codes')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('code_hash', 'text', (c) => c.notNull().unique())
    .addColumn('issued_by', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('issued_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('revoked_at', 'timestamptz')
    .execute();
  await sql`CREATE UNIQUE INDEX access_codes_live ON access_codes (student_row_id) WHERE revoked_at IS NULL`.execute(db);

  await db.schema
    .createTable('student_sessions')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('session_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('student_sessions_student').on('student_sessions').column('student_row_id').execute();

  await db.schema
    .createTable('deadlines')
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('due_at', 'timestamptz', (c) => c.notNull())
    .addColumn('set_by', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('set_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('deadlines_pkey', ['assignment_id', 'section_id'])
    .execute();

  await db.schema
    .alterTable('submissions')
    .addColumn('source', 'text', (c) => c.notNull().defaultTo('staff').check(sql`source IN ('staff', 'student')`))
    .addColumn('late', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('held', 'boolean', (c) => c.notNull().defaultTo(false))
    .addColumn('late_accepted_by', 'integer', (c) => c.references('staff.id'))
    .addColumn('late_accepted_at', 'timestamptz')
    .execute();

  await db.schema
    .createTable('feedback_reads')
    .addColumn('release_id', 'integer', (c) => c.primaryKey().references('releases.id'))
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('first_read_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('feedback_reads').execute();
  await db.schema
    .alterTable('submissions')
    .dropColumn('source')
    .dropColumn('late')
    .dropColumn('held')
    .dropColumn('late_accepted_by')
    .dropColumn('late_accepted_at')
    .execute();
  await db.schema.dropTable('deadlines').execute();
  await db.schema.dropTable('student_sessions').execute();
  await db.schema.dropTable('access_codes').execute();
}
