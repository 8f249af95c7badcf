import { sql, type Kysely } from 'kysely';

/**
 * Browser sessions of the workspace: a staff member signs in with a token once and the browser then
 * holds only a session cookie, whose value is stored as a SHA-256 hash. A session ends at its expiry,
 * at sign-out, or when the staff member's tokens are revoked.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('sessions')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('staff_id', 'integer', (c) => c.notNull().references('staff.id'))
    .addColumn('session_hash', 'text', (c) => c.notNull().unique())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('sessions').execute();
}
