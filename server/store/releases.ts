import { sql, type Kysely } from 'kysely';
import { inParts } from '../in-parts.ts';
import type { Database } from './database.ts';

/** What a TA released of one submission: the result, and the last override and signal choice it included. */
export interface NewRelease {
  submissionId: number;
  resultId: number;
  overridesThrough: number;
  choicesThrough: number;
}

/** The latest release of each of the given submissions (what its student sees). */
export async function latestReleases(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return db
    .selectFrom('releases')
    .select([
      'releases.id as id',
      'releases.submission_id as submissionId',
      'releases.result_id as resultId',
      'releases.overrides_through as overridesThrough',
      'releases.choices_through as choicesThrough',
      'releases.released_at as releasedAt',
    ])
    .where('releases.id', 'in', (eb) => eb.selectFrom('releases as r').select((e) => e.fn.max('r.id').as('id')).where('r.submission_id', 'in', submissionIds).groupBy('r.submission_id'))
    .execute();
}

export type ReleaseRow = Awaited<ReturnType<typeof latestReleases>>[number];

/** Records releases, in the caller's transaction; the released results are marked released too. */
export async function insertReleases(db: Kysely<Database>, releases: NewRelease[], staffId: number): Promise<void> {
  if (releases.length === 0) return;
  // PostgreSQL takes at most 65,535 parameters in one statement: 1,000 rows of 5 at a time.
  for (const part of inParts(releases, 1000)) {
    await db
      .insertInto('releases')
      .values(part.map((r) => ({ submission_id: r.submissionId, result_id: r.resultId, overrides_through: r.overridesThrough, choices_through: r.choicesThrough, released_by: staffId })))
      .execute();
    await db
      .updateTable('results')
      .set({ released_at: sql<Date>`now()`, released_by: staffId })
      .where('id', 'in', part.map((r) => r.resultId))
      .where('released_at', 'is', null)
      .execute();
  }
}
