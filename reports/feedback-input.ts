import type { CheckResult } from '../schemas/result.ts';
import type { SectionSignals } from '../server/signals/section-report.ts';

/** Any kind's parsed settings: the kind's report reads the rest. */
export interface KindSettings {
  kind: string;
}

/** What a feedback sheet is made from: plain data, no schema objects, no I/O. */
export interface FeedbackHeader {
  course: string;
  section: string;
  assignment: string;
  /** Pseudonymous id only; names never reach a sheet. */
  studentId: string;
  /** The submission's version: 1 for the first, +1 for each resubmission. */
  version: number;
  gradedAt: Date | string;
  /** false: the result is not yet released to the student, and the sheet says it is a draft. */
  released?: boolean;
}

/** A result whose refit has its kind's shape: the registry hands a kind's report only results of that kind. */
export type KindResult<Refit = CheckResult['refit']> = Omit<CheckResult, 'refit'> & { refit: Refit | null };

export interface FeedbackInput<Settings extends KindSettings = KindSettings, Submission = unknown, Refit = CheckResult['refit']> {
  header: FeedbackHeader;
  /** Parsed settings (defaults filled), as `parseAssignment` returns them. */
  settings: Settings;
  /** The submission the result was checked from, as the kind's schema parsed it. */
  submission: Submission;
  result: KindResult<Refit>;
  /** The data are invented (demo or test): says so in every page's footer. */
  invented?: boolean;
}

export interface SummaryHeader {
  course: string;
  section: string;
  assignment: string;
  gradedAt: Date | string;
}

export interface SectionSummaryInput<Settings extends KindSettings = KindSettings, Submission = unknown, Refit = CheckResult['refit']> {
  header: SummaryHeader;
  settings: Settings;
  results: Array<KindResult<Refit>>;
  /** The submissions, matched to results by student id (the kind's report may summarise their reported values too). */
  submissions?: Submission[];
  /** The section's signals for review, where they were computed. */
  signals?: SectionSignals;
  invented?: boolean;
}

/** Footer text for invented data, the same on both documents. */
export const INVENTED_NOTE = 'Invented demonstration data: generated, not measured, and not any real student’s work.';

/** The sentence every feedback sheet carries about what a diagnosis is. */
export const LIKELY_CAUSES_NOTE =
  'Each diagnosis below names a likely cause of a difference, read from the numbers; it is not a verdict. ' +
  'A teaching assistant reviews these findings and can override any of them.';

/** Added to the note on a sheet whose result a TA has not yet released. */
export const DRAFT_NOTE = 'Draft for the teaching assistant: this result has not been released to the student.';
