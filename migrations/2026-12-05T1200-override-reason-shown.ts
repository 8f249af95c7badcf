import { sql, type Kysely } from 'kysely';

/**
 * Whether an override's reason is printed on the student's sheet. It is kept in the audit trail in
 * any case; until a TA chooses to show it (and for every override made before this choice existed),
 * the sheet says only that the points were reviewed.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`alter table overrides add column reason_shown boolean not null default false`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`alter table overrides drop column reason_shown`.execute(db);
}
