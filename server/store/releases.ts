import { sql, type Kysely } from 'kysely';
import { inParts } from './in-parts.ts';
import type { Database } from './database.ts';

/** What a TA released of one submission: the result, and the last override and signal choice it included. */
export interface NewRelease {
  submissionId: number;
  resultId: number;
  overridesThrough: number;
  choicesThrough: number;
}

/**
 * What each given submission's student is shown for its assignment: the latest release of any of
 * their versions up to that one (a version never released shows nothing new), keyed by the given
 * submission; `submissionId` and `version` are the version released.
 */
export async function latestReleases(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return db
    .selectFrom('submissions as asked')
    .innerJoinLateral(
      (eb) =>
        eb
          .selectFrom('releases')
          .innerJoin('submissions as shown', 'shown.id', 'releases.submission_id')
          .whereRef('shown.student_row_id', '=', 'asked.student_row_id')
          .whereRef('shown.assignment_id', '=', 'asked.assignment_id')
          .whereRef('shown.version', '<=', 'asked.version')
          .select(['releases.id', 'releases.submission_id', 'shown.version', 'releases.result_id', 'releases.overrides_through', 'releases.choices_through', 'releases.released_at'])
          .orderBy('releases.id', 'desc')
          .limit(1)
          .as('release'),
      (join) => join.onTrue(),
    )
    .select([
      'asked.id as forSubmissionId',
      'release.id as id',
      'release.submission_id as submissionId',
      'release.version as version',
      'release.result_id as resultId',
      'release.overrides_through as overridesThrough',
      'release.choices_through as choicesThrough',
      'release.released_at as releasedAt',
    ])
    .where('asked.id', 'in', submissionIds)
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
