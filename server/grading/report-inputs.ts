import type { Kysely } from 'kysely';
import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings } from '../../reports/feedback-input.ts';
import type { Database } from '../store/database.ts';
import { sectionLatestResults } from '../store/latest-results.ts';
import { reportNames } from '../store/names.ts';
import { latestReleases } from '../store/releases.ts';
import { signalChoicesOf, type SignalChoiceRow } from '../store/signal-choices.ts';
import { latestResults, latestResultSummaries, latestSubmissions, overridesOf, resultsByIds, submissionsByIds, type OverrideRow, type ResultRow, type SubmissionRow } from '../store/submissions.ts';
import { assignmentOf } from './assignment-of.ts';
import type { EffectiveResult } from './effective-result.ts';
import { pageCounts } from './page-summary.ts';
import { resultAndRelease, type ResultAndRelease } from './released.ts';

/**
 * What the reports are made from, read from the store: each submission's latest result with the
 * TAs' overrides applied (and, for sheets, the signals they chose to show), beside what its student
 * was shown; the settings that result used, and the names for the header. Sheets and the gradebook
 * show what was released, where something was, until a TA releases the new result.
 */
function asCheckResult(studentId: string, r: EffectiveResult): CheckResult {
  return { studentId, status: r.status as CheckResult['status'], score: r.score, maxScore: r.maxScore, items: r.items, refit: r.refit as CheckResult['refit'], findings: r.findings, signals: r.signals, rejected: r.rejected, engineVersion: r.engineVersion };
}

type Standing = ResultAndRelease & { row: ResultRow; releasedRow?: ResultRow };

/** Each submission's latest result and its student's latest release; `full` reads refits and settings too (for sheets). */
async function resultsAndReleases(db: Kysely<Database>, ids: number[], full: boolean): Promise<Map<number, Standing>> {
  return (await readResultsAndReleases(db, ids, full)).results;
}

/** The same, with the overrides and signal choices it read. */
async function readResultsAndReleases(db: Kysely<Database>, ids: number[], full: boolean): Promise<{ results: Map<number, Standing>; overrides: OverrideRow[]; choices: SignalChoiceRow[] }> {
  const latest = await (full ? latestResults(db, ids) : latestResultSummaries(db, ids));
  const releases = new Map((await latestReleases(db, ids)).map((r) => [r.forSubmissionId, r]));
  // A release of an earlier version keeps that version's overrides and choices.
  const withReleased = [...new Set([...ids, ...[...releases.values()].map((r) => r.submissionId)])];
  const overrides = await overridesOf(db, withReleased);
  const choices = await signalChoicesOf(db, withReleased);
  const byId = new Map(latest.map((r) => [r.resultId, r]));
  const older = [...new Set([...releases.values()].map((r) => r.resultId))].filter((id) => !byId.has(id));
  for (const r of await resultsByIds(db, older, !full)) byId.set(r.resultId, r);
  const out = new Map<number, Standing>();
  for (const row of latest) {
    const release = releases.get(row.submissionId);
    const releasedRow = release && byId.get(release.resultId);
    out.set(row.submissionId, { row, releasedRow, ...resultAndRelease(row, release, releasedRow, overrides, choices) });
  }
  return { results: out, overrides, choices };
}

/** Which result a report shows: what the student was shown, or (a TA's preview) the latest. */
export type Showing = 'released' | 'latest';

async function feedbackInputs(db: Kysely<Database>, rows: SubmissionRow[], sectionId: number, assignmentId: number, showing: Showing): Promise<FeedbackInput[]> {
  if (rows.length === 0) return [];
  const names = await reportNames(db, sectionId, assignmentId);
  const results = await resultsAndReleases(db, rows.map((r) => r.submissionId), true);
  // A release of an earlier version shows that version's values and number.
  const submissions = new Map(rows.map((r) => [r.submissionId, r]));
  const earlier = [...results.values()].flatMap((r) => (r.releasedSubmissionId !== undefined && !submissions.has(r.releasedSubmissionId) ? [r.releasedSubmissionId] : []));
  for (const r of await submissionsByIds(db, [...new Set(earlier)])) submissions.set(r.submissionId, r);
  // Results of one settings version share their parsed settings.
  const checkers = new Map<number, ReturnType<typeof assignmentOf>>();
  const out: FeedbackInput[] = [];
  for (const row of rows) {
    const both = results.get(row.submissionId);
    if (!both) continue;
    const useReleased = showing === 'released' && both.released !== undefined;
    const [stored, shown] = useReleased ? [both.releasedRow!, both.released!] : [both.row, both.current];
    if (stored.status !== 'checked') continue;
    const version = submissions.get(stored.submissionId)!;
    const checker = checkers.get(stored.settingsVersion) ?? assignmentOf(stored.settings, 'settings');
    checkers.set(stored.settingsVersion, checker);
    out.push({
      header: { ...names, studentId: row.studentId, version: version.version, gradedAt: stored.gradedAt, released: useReleased || (both.released !== undefined && !both.changedSinceRelease) },
      settings: checker.settings as KindSettings,
      submission: checker.kind.submissionSchema.parse(version.payload),
      result: asCheckResult(row.studentId, shown),
    });
  }
  return out;
}

/** One submission's sheet, from its row as the request read it. */
export async function submissionFeedback(db: Kysely<Database>, row: SubmissionRow, showing: Showing = 'released'): Promise<FeedbackInput | undefined> {
  return (await feedbackInputs(db, [row], row.sectionId, row.assignmentId, showing))[0];
}

/** Every checked student of a section (latest version each), in student-id order. */
export async function sectionFeedback(db: Kysely<Database>, sectionId: number, assignmentId: number, showing: Showing = 'released'): Promise<FeedbackInput[]> {
  return feedbackInputs(db, await latestSubmissions(db, assignmentId, sectionId), sectionId, assignmentId, showing);
}

/**
 * Every roster student of a section in student-id order: their latest version with its latest result
 * (overrides applied) and what was released of it, or no `submission` when they submitted nothing.
 * One read of the store (latest-results.ts).
 */
export async function sectionStandings(db: Kysely<Database>, sectionId: number, assignmentId: number) {
  return (await sectionLatestResults(db, sectionId, assignmentId)).map(({ studentId, enrolment, latest }) => {
    if (!latest) return { studentId, enrolment };
    const both = resultAndRelease(latest.result, latest.release, latest.releasedRow, latest.overrides, latest.choices);
    return {
      studentId,
      enrolment,
      submission: latest.submission,
      result: both.current,
      released: both.released,
      releasedVersion: both.releasedVersion,
      changedSinceRelease: both.changedSinceRelease,
      feedbackFirstReadAt: latest.feedbackFirstReadAt,
    };
  });
}

/**
 * The results page's rows, in student-id order: each student's latest version with what the page shows
 * of its latest result (score, counts by cause, codes) and of what was released. Taken from the page
 * summaries kept when the results were stored where they do (no override or signal choice for the
 * student, both results summarised), so that a section's findings are not read and grouped on every
 * view; otherwise worked out from the findings, overrides applied, as `sectionStandings` does.
 */
export async function sectionPageRows(db: Kysely<Database>, sectionId: number, assignmentId: number) {
  return (await sectionLatestResults(db, sectionId, assignmentId, 'where-needed')).map(({ studentId, enrolment, latest }) => {
    if (!latest) return { studentId, enrolment };
    const { submission, feedbackFirstReadAt, release, pageSummaries } = latest;
    const common = { studentId, enrolment, submission, feedbackFirstReadAt, status: latest.result.status };
    if (pageSummaries) {
      // As resultAndRelease: a release whose result was not read counts as none.
      const released = release && pageSummaries.released;
      return {
        ...common,
        shows: pageSummaries.latest,
        released: released ? { score: released.score, version: release.version } : undefined,
        changedSinceRelease: released ? release.submissionId !== submission.submissionId || pageSummaries.latest.shown !== released.shown : false,
      };
    }
    const both = resultAndRelease(latest.result, release, latest.releasedRow, latest.overrides, latest.choices);
    return {
      ...common,
      shows: { score: both.current.score, maxScore: both.current.maxScore, ...pageCounts(both.current.findings) },
      released: both.released ? { score: both.released.score, version: both.releasedVersion! } : undefined,
      changedSinceRelease: both.changedSinceRelease,
    };
  });
}

/** The releases due for these submissions: each whose latest result is not released yet, or changed since its release. */
export async function releasesDue(db: Kysely<Database>, submissionIds: number[]) {
  const results = await resultsAndReleases(db, submissionIds, false);
  return [...results.values()].flatMap((r) => (r.released === undefined || r.changedSinceRelease ? [r.nextRelease] : []));
}

/**
 * One submission as a TA reviews it, each part read once: its latest result with the overrides and
 * signal choices applied, those overrides and choices themselves, and what its student was shown
 * (undefined when nothing was released).
 */
export async function submissionStanding(db: Kysely<Database>, submissionId: number) {
  const { results, overrides, choices } = await readResultsAndReleases(db, [submissionId], true);
  const both = results.get(submissionId);
  const releasedAt = both?.released?.releasedAt;
  const release = both?.released && releasedAt && both.releasedVersion !== undefined
    ? { at: releasedAt, version: both.releasedVersion, score: both.released.score, changedSinceRelease: both.changedSinceRelease }
    : undefined;
  return {
    current: both?.current,
    overrides: overrides.filter((o) => o.submissionId === submissionId),
    choices: choices.filter((c) => c.submissionId === submissionId),
    release,
  };
}

/**
 * Gradebook rows: what each student was shown, or their latest result where nothing was released;
 * rejected ones included. `held`: the students whose latest version is late and held until a TA
 * accepts it, whose row is not final.
 */
export async function sectionResults(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<{ results: CheckResult[]; held: Set<string> }> {
  const standings = (await sectionStandings(db, sectionId, assignmentId)).flatMap((s) => (s.submission ? [{ ...s, submission: s.submission }] : []));
  return {
    results: standings.map((s) => asCheckResult(s.studentId, s.released ?? s.result)),
    held: new Set(standings.filter((s) => s.submission.held).map((s) => s.studentId)),
  };
}
