import { sql, type Kysely } from 'kysely';

/**
 * Grades sent to learning platforms (AGS 2.0). A context's line item container URL, kept beside its
 * membership URL (either may come first, so neither is required); the line item each assignment's
 * scores go to in a context; and, per student and assignment, where the sending of their released
 * score stands: waiting (queued, or tried and to be tried again, with the last failure's reason),
 * sent, or failed (given up, with the reason). `generation` grows with each release that changes what
 * is to be sent, so a send that finishes after a newer release does not mark the newer one sent. The
 * passback records kept while no platform was connected are dropped: this replaces them.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('lti_contexts').alterColumn('memberships_url', (c) => c.dropNotNull()).execute();
  await db.schema.alterTable('lti_contexts').addColumn('line_items_url', 'text').execute();

  await db.schema
    .createTable('lti_line_items')
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('context_id', 'text', (c) => c.notNull())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('url', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('lti_line_items_pk', ['platform_id', 'context_id', 'assignment_id'])
    .execute();

  await db.schema
    .createTable('grade_sends')
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('generation', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('state', 'text', (c) => c.notNull().check(sql`state in ('waiting', 'sent', 'failed')`))
    .addColumn('reason', 'text')
    .addColumn('tries', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('queued_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('sent_at', 'timestamptz')
    .addColumn('sent_score', 'double precision')
    .addPrimaryKeyConstraint('grade_sends_pk', ['assignment_id', 'student_row_id'])
    .execute();

  await db.schema.dropTable('passback_records').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('passback_records')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('grades', 'jsonb', (c) => c.notNull())
    .addColumn('recorded_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.dropTable('grade_sends').execute();
  await db.schema.dropTable('lti_line_items').execute();
  await db.schema.alterTable('lti_contexts').dropColumn('line_items_url').execute();
}
