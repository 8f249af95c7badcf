import type { Kysely } from 'kysely';
import { checkedDisplay, rejectedDisplay } from '../../reports/display/submission-display.ts';
import type { FeedbackInput } from '../../reports/feedback-input.ts';
import type { SubmissionDisplay } from '../../schemas/display.ts';
import { reportFor, stagesOf } from '../../kinds/registry.ts';
import type { Database } from '../store/database.ts';
import { latestResults, type ResultRow, type SubmissionRow } from '../store/submissions.ts';
import { submissionFeedback } from './report-inputs.ts';

const NOTHING: SubmissionDisplay = { counts: null, stages: [], rejected: [], comparison: null, plots: [] };

/** The page of a checked result, made from what its sheet is made from. */
export async function displayOfInput(input: FeedbackInput): Promise<SubmissionDisplay> {
  const report = await reportFor(input.settings.kind);
  return checkedDisplay(input, { describe: (path) => report.describePath(path, input.submission), stages: stagesOf(input.settings.kind), kindDisplay: report.display });
}

/** The page of a result that could not be checked: its problems in words; nothing for no result. */
export async function displayOfRefused(row: ResultRow | undefined, payload: unknown): Promise<SubmissionDisplay> {
  const rejected = (row?.findings as { rejected?: Array<{ path: string; message: string }> } | undefined)?.rejected ?? [];
  if (!row || rejected.length === 0) return NOTHING;
  const report = await reportFor((row.settings as { kind: string }).kind);
  return rejectedDisplay(rejected, (path) => report.describePath(path, payload));
}

/**
 * The workspace's student page for a submission's latest result (the TAs' overrides applied), made
 * from what its sheet is made from: a refused result shows its problems in words, an ungraded one nothing.
 */
export async function submissionDisplay(db: Kysely<Database>, submission: SubmissionRow): Promise<SubmissionDisplay> {
  const input = await submissionFeedback(db, submission, 'latest');
  if (input) return displayOfInput(input);
  const [row] = await latestResults(db, [submission.submissionId]);
  return displayOfRefused(row, submission.payload);
}
