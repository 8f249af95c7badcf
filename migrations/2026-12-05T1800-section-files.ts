import { sql, type Kysely } from 'kysely';

/**
 * A large section's feedback ZIP or summary, drawn by a job and kept here for its download: the
 * database is the one place every service process shares, so any process answers the poll and streams
 * the file, whichever drew it. Each file expires (the scheduled cleanup deletes it) so the table does
 * not grow with every download.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('section_files')
    .addColumn('id', 'uuid', (c) => c.primaryKey())
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('document', 'text', (c) => c.notNull().check(sql`document in ('feedback.zip', 'summary.pdf')`))
    .addColumn('total', 'integer', (c) => c.notNull())
    .addColumn('done', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('running').check(sql`status in ('running', 'finished', 'failed')`))
    .addColumn('error', 'text')
    .addColumn('name_ascii', 'text')
    .addColumn('name_unicode', 'text')
    .addColumn('content', 'bytea')
    .addColumn('started_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('finished_at', 'timestamptz')
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('section_files_expiry').on('section_files').column('expires_at').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('section_files').execute();
}
