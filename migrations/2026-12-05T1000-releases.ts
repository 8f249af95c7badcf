import { sql, type Kysely } from 'kysely';

/**
 * What each student was shown: a release names the result a TA released and the last override and
 * signal choice it included, so a regrade or a later override leaves the released result as it was
 * until a TA releases the new one. Every release is kept; the latest per submission counts. Results
 * released before releases were kept become releases with every override and choice made so far
 * (those were shown at once then).
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('releases')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('submission_id', 'integer', (c) => c.notNull().references('submissions.id'))
    .addColumn('result_id', 'integer', (c) => c.notNull().references('results.id'))
    .addColumn('overrides_through', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('choices_through', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('released_by', 'integer', (c) => c.references('staff.id'))
    .addColumn('released_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .execute();
  await db.schema.createIndex('releases_submission').on('releases').columns(['submission_id', 'id']).execute();
  await sql`
    INSERT INTO releases (submission_id, result_id, overrides_through, choices_through, released_by, released_at)
    SELECT DISTINCT ON (r.submission_id) r.submission_id, r.id,
      COALESCE((SELECT max(o.id) FROM overrides o WHERE o.submission_id = r.submission_id), 0),
      COALESCE((SELECT max(c.id) FROM signal_choices c WHERE c.submission_id = r.submission_id), 0),
      r.released_by, r.released_at
    FROM results r
    WHERE r.released_at IS NOT NULL
    ORDER BY r.submission_id, r.id DESC`.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('releases').execute();
}
