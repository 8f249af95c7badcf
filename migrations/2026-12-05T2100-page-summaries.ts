import type { Kysely } from 'kysely';

/**
 * What the results page shows of a result before any override (score, counts by cause, codes, what a
 * student would notice), kept beside it when it is stored, so that the page reads no findings for a
 * student nobody has overridden. Results stored before stay without one: the page works theirs out
 * from the findings, as it did for all.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('results').addColumn('page_summary', 'jsonb').execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('results').dropColumn('page_summary').execute();
}
