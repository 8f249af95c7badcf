import type { Kysely } from 'kysely';

/**
 * A deep linking request waiting for the instructor's choice: its one-time ticket (as a hash), the
 * platform and deployment it came from, where the answer goes and the opaque data to echo back. Taken
 * once, when the choice is posted.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('lti_deep_links')
    .addColumn('ticket_hash', 'text', (c) => c.primaryKey())
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('deployment_id', 'text', (c) => c.notNull())
    .addColumn('return_url', 'text', (c) => c.notNull())
    .addColumn('data', 'text')
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('lti_deep_links').execute();
}
