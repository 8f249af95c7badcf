import type { Kysely } from 'kysely';

/**
 * A platform context's membership service URL (the NRPS claim of an instructor's or TA's launch):
 * the one thing a roster pull needs of the context. Nothing of the person who launched is kept here.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('lti_contexts')
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('context_id', 'text', (c) => c.notNull())
    .addColumn('memberships_url', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('lti_contexts_pk', ['platform_id', 'context_id'])
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('lti_contexts').execute();
}
