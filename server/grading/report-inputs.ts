import type { Kysely } from 'kysely';
import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings } from '../../reports/feedback-input.ts';
import type { Database } from '../store/database.ts';
import { reportNames } from '../store/names.ts';
import { signalChoicesOf } from '../store/signal-choices.ts';
import { getSubmission, latestResults, latestResultSummaries, latestSubmissionHeads, latestSubmissions, overridesOf, type SubmissionRow } from '../store/submissions.ts';
import { assignmentOf } from './assignment-of.ts';
import { effectiveResult, type EffectiveResult } from './effective-result.ts';

/**
 * What the reports are made from, read from the store: each submission's latest result with the
 * TAs' overrides applied (and, for sheets, the signals they chose to show), the settings that result used, and the names for the header.
 */
function asCheckResult(studentId: string, r: EffectiveResult): CheckResult {
  return { studentId, status: r.status as CheckResult['status'], score: r.score, maxScore: r.maxScore, items: r.items, refit: r.refit as CheckResult['refit'], findings: r.findings, signals: r.signals, rejected: r.rejected, engineVersion: r.engineVersion };
}

async function feedbackInputs(db: Kysely<Database>, rows: SubmissionRow[], sectionId: number, assignmentId: number): Promise<FeedbackInput[]> {
  if (rows.length === 0) return [];
  const names = await reportNames(db, sectionId, assignmentId);
  const ids = rows.map((r) => r.submissionId);
  const results = new Map((await latestResults(db, ids)).map((r) => [r.submissionId, r]));
  const overrides = await overridesOf(db, ids);
  const choices = await signalChoicesOf(db, ids);
  // Results of one settings version share their parsed settings.
  const checkers = new Map<number, ReturnType<typeof assignmentOf>>();
  const out: FeedbackInput[] = [];
  for (const row of rows) {
    const stored = results.get(row.submissionId);
    if (!stored || stored.status !== 'checked') continue;
    const checker = checkers.get(stored.settingsVersion) ?? assignmentOf(stored.settings, 'settings');
    checkers.set(stored.settingsVersion, checker);
    const result = asCheckResult(row.studentId, effectiveResult(stored, overrides, choices));
    out.push({
      header: { ...names, studentId: row.studentId, version: row.version, gradedAt: stored.gradedAt, released: stored.releasedAt !== null },
      settings: checker.settings as KindSettings,
      submission: checker.kind.submissionSchema.parse(row.payload),
      result,
    });
  }
  return out;
}

export async function submissionFeedback(db: Kysely<Database>, submissionId: number): Promise<FeedbackInput | undefined> {
  const row = await getSubmission(db, submissionId);
  if (!row) return undefined;
  return (await feedbackInputs(db, [row], row.sectionId, row.assignmentId))[0];
}

/** Every checked student of a section (latest version each), in student-id order. */
export async function sectionFeedback(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<FeedbackInput[]> {
  return feedbackInputs(db, await latestSubmissions(db, assignmentId, sectionId), sectionId, assignmentId);
}

/** The latest submission of each student in a section, with its latest result, overrides applied. */
export async function latestWithResults(db: Kysely<Database>, sectionId: number, assignmentId: number) {
  // Without payloads, refits and settings: a table of the section needs none of them.
  const rows = await latestSubmissionHeads(db, assignmentId, sectionId);
  const ids = rows.map((r) => r.submissionId);
  const results = new Map((await latestResultSummaries(db, ids)).map((r) => [r.submissionId, r]));
  const overrides = await overridesOf(db, ids);
  return rows.map((submission) => {
    const row = results.get(submission.submissionId);
    return { submission, result: row ? effectiveResult(row, overrides) : undefined };
  });
}

/** Gradebook rows: every student's latest result, rejected ones included. */
export async function sectionResults(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<CheckResult[]> {
  return (await latestWithResults(db, sectionId, assignmentId)).flatMap(({ submission, result }) => (result ? [asCheckResult(submission.studentId, result)] : []));
}
