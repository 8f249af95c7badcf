import type { Kysely } from 'kysely';
import type { Database } from '../store/database.ts';
import { latestReleases } from '../store/releases.ts';
import { resultsByIds, submissionsByIds, type SubmissionRow } from '../store/submissions.ts';
import { submissionFeedback } from './report-inputs.ts';
import { displayOfInput, displayOfRefused } from './submission-display.ts';

/**
 * What a student was released of their latest version (the release, and the sheet's input when the
 * released result was checked): the result, overrides and signal choices as they stood at the
 * release, never a later result; undefined before anything was released.
 */
export async function releasedToStudent(db: Kysely<Database>, latest: SubmissionRow) {
  const [release] = await latestReleases(db, [latest.submissionId]);
  if (!release) return undefined;
  return { release, input: await submissionFeedback(db, latest, 'released') };
}

/** The student's feedback page: the staff's page of the submission, drawn for the released result. */
export async function ownFeedback(db: Kysely<Database>, released: NonNullable<Awaited<ReturnType<typeof releasedToStudent>>>) {
  const { release, input } = released;
  const base = { version: release.version, releasedAt: release.releasedAt };
  if (input) return { ...base, score: input.result.score, maxScore: input.result.maxScore, display: await displayOfInput(input) };
  // A released result that could not be checked (a regrade under settings it no longer fits): its problems.
  const [row] = await resultsByIds(db, [release.resultId]);
  const [version] = await submissionsByIds(db, [release.submissionId]);
  return { ...base, score: null, maxScore: null, display: await displayOfRefused(row, version?.payload) };
}
