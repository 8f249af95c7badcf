import { sql, type Kysely } from 'kysely';

/**
 * Courses, sections, staff and their tokens, rosters, assignments, immutable submission versions,
 * grading results, finding overrides (an audit trail) and idempotency records. Frozen once released:
 * later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('courses')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('sections')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('course_id', 'integer', (c) => c.notNull().references('courses.id'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addUniqueConstraint('sections_course_name', ['course_id', 'name'])
    .execute();

  await db.schema
    .createTable('staff')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('course_id', 'integer', (c) => c.notNull().references('courses.id'))
    .addColumn('handle', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('instructor', 'ta')`))
    .addUniqueConstraint('staff_course_handle', ['course_id', 'handle'])
    .execute();

  await db.schema
    .createTable('ta_sections')
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addPrimaryKeyConstraint('ta_sections_pk', ['staff_id', 'section_id'])
    .execute();

  await db.schema
    .createTable('api_tokens')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('revoked_at', 'timestamptz')
    .execute();

  await db.schema
    .createTable('students')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('course_id', 'integer', (c) => c.notNull().references('courses.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('student_id', 'text', (c) => c.notNull())
    .addColumn('display_name', 'text')
    // One section per course: the pseudonymous id is unique within the course.
    .addUniqueConstraint('students_course_student', ['course_id', 'student_id'])
    .execute();

  await db.schema
    .createTable('assignments')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('course_id', 'integer', (c) => c.notNull().references('courses.id'))
    .addColumn('title', 'text', (c) => c.notNull())
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('settings', 'jsonb', (c) => c.notNull())
    .addColumn('settings_version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();

  await db.schema
    .createTable('submissions')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('version', 'integer', (c) => c.notNull())
    .addColumn('payload', 'jsonb', (c) => c.notNull())
    .addColumn('submitted_by', 'integer', (c) => c.references('staff.id'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('submissions_version', ['assignment_id', 'student_row_id', 'version'])
    .execute();

  await db.schema
    .createTable('results')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('submission_id', 'integer', (c) => c.notNull().references('submissions.id'))
    .addColumn('engine_version', 'text', (c) => c.notNull())
    .addColumn('settings_version', 'integer', (c) => c.notNull())
    .addColumn('settings', 'jsonb', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('score', 'double precision')
    .addColumn('max_score', 'double precision', (c) => c.notNull())
    .addColumn('refit', 'jsonb')
    .addColumn('findings', 'jsonb', (c) => c.notNull())
    .addColumn('released_at', 'timestamptz')
    .addColumn('released_by', 'integer', (c) => c.references('staff.id'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('results_submission').on('results').columns(['submission_id', 'id']).execute();

  await db.schema
    .createTable('overrides')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('submission_id', 'integer', (c) => c.notNull().references('submissions.id'))
    .addColumn('finding_id', 'text', (c) => c.notNull())
    .addColumn('points_before', 'double precision', (c) => c.notNull())
    .addColumn('points_after', 'double precision', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('overrides_submission').on('overrides').columns(['submission_id', 'finding_id', 'id']).execute();

  await db.schema
    .createTable('idempotency_keys')
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('request_hash', 'text', (c) => c.notNull())
    .addColumn('status_code', 'integer', (c) => c.notNull())
    .addColumn('body', 'jsonb', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('idempotency_keys_pk', ['staff_id', 'key'])
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of ['idempotency_keys', 'overrides', 'results', 'submissions', 'assignments', 'students', 'api_tokens', 'ta_sections', 'staff', 'sections', 'courses']) {
    await db.schema.dropTable(table).execute();
  }
}
