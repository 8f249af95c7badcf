import { sql, type Kysely } from 'kysely';

/**
 * A roster student is enrolled, withdrawn or removed, never deleted: their submissions and results
 * stay. Every change of status is kept with who made it and when.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .alterTable('students')
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('enrolled').check(sql`status in ('enrolled', 'withdrawn', 'removed')`))
    .execute();
  await db.schema
    .createTable('roster_events')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('student_row_id', 'integer', (c) => c.notNull().references('students.id'))
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('staff_id', 'integer', (c) => c.references('staff.id'))
    .addColumn('at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('roster_events').execute();
  await db.schema.alterTable('students').dropColumn('status').execute();
}
