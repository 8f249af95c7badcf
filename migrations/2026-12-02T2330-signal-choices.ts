import { sql, type Kysely } from 'kysely';

/**
 * A TA's choice to put a signal for review on a student's sheet, or take it off again: every choice is
 * kept with who made it and when, and the latest one per signal counts. Keyed by submission and the
 * signal's code and place, so a choice carries over to a regrade that raises the same signal.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('signal_choices')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('submission_id', 'integer', (c) => c.notNull().references('submissions.id'))
    .addColumn('code', 'text', (c) => c.notNull())
    .addColumn('path', 'text', (c) => c.notNull())
    .addColumn('on_sheet', 'boolean', (c) => c.notNull())
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('signal_choices_submission').on('signal_choices').columns(['submission_id', 'id']).execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('signal_choices').execute();
}
