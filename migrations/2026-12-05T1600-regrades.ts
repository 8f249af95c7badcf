import { sql, type Kysely } from 'kysely';

/**
 * Regrades kept in the database, so that any service process answers for any of them and any process
 * can finish one another began. A regrade fixes at its start the submissions it covers, cut into
 * parts, and the settings it applies; each part is done in one transaction that marks it done, so a
 * part done twice (a job taken up again after its process died) stores nothing twice. The passback
 * record keeps what grade passback would send, until a learning platform is connected.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('regrades')
    .addColumn('id', 'uuid', (c) => c.primaryKey())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('section_id', 'integer', (c) => c.references('sections.id'))
    .addColumn('settings', 'jsonb', (c) => c.notNull())
    .addColumn('settings_version', 'integer', (c) => c.notNull())
    .addColumn('total', 'integer', (c) => c.notNull())
    .addColumn('done', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('running').check(sql`status in ('running', 'finished', 'failed')`))
    .addColumn('error', 'text')
    .addColumn('started_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('finished_at', 'timestamptz')
    .execute();
  await db.schema.createIndex('regrades_assignment').on('regrades').columns(['assignment_id', 'started_at']).execute();
  await db.schema
    .createTable('regrade_parts')
    .addColumn('regrade_id', 'uuid', (c) => c.notNull().references('regrades.id'))
    .addColumn('part', 'integer', (c) => c.notNull())
    .addColumn('submission_ids', 'jsonb', (c) => c.notNull())
    .addColumn('done_at', 'timestamptz')
    .addPrimaryKeyConstraint('regrade_parts_key', ['regrade_id', 'part'])
    .execute();
  await db.schema
    .createTable('passback_records')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('grades', 'jsonb', (c) => c.notNull())
    .addColumn('recorded_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('passback_records').execute();
  await db.schema.dropTable('regrade_parts').execute();
  await db.schema.dropTable('regrades').execute();
}
