import type { KindDescription } from '../schemas/api/kinds.ts';
import type { KindDisplay } from '../schemas/display.ts';
import type { CheckResult } from '../schemas/result.ts';
import type { FeedbackInput, KindResult, KindSettings, SectionSummaryInput } from './feedback-input.ts';
import type { RubricLine } from './feedback/rubric-lines.ts';
import type { Doc } from './pdf/document.ts';

/**
 * What an experiment kind adds to the documents; the sheet and the summary draw everything else
 * (header, score, findings by stage, notes on the measurement, score distribution, codes, signals)
 * the same for every kind. Settings, submissions and refits arrive as the kind's schemas made them: the
 * registry hands a kind's report only its own kind's (its methods take them typed, so none casts).
 */
export interface KindReport<Settings extends KindSettings = KindSettings, Submission = unknown, Refit = CheckResult['refit']> {
  /** What the workspace draws the kind's settings form, upload panel and signals panel from. */
  description: KindDescription;
  /** A finding's or signal's place in words, with sub/superscript markup: `runs[2].reported.k` → Run “0.20 M”: k_{obs}. A refused submission may be of no kind's shape. */
  describePath(path: string, submission: unknown): string;
  /** The score taken apart by rubric item. */
  rubricBreakdown(settings: Settings, submission: Submission | undefined, result: CheckResult): RubricLine[];
  /** The sheet after the findings of a checked result: reported against refit values, plots. */
  drawSheetData(doc: Doc, input: FeedbackInput<Settings, Submission, Refit>): void;
  /** The same values and plots for the workspace's student page, as data the page draws. */
  display(input: FeedbackInput<Settings, Submission, Refit>): KindDisplay;
  /** Facts for the summary's header beside course, section and assignment: [label, value]. */
  summaryFacts(settings: Settings): Array<[string, string]>;
  /** The summary's part on the class's values, gathered one result and one submission at a time. */
  summaryPart(settings: Settings): KindSummaryPart<Submission, Refit>;
}

/**
 * A kind's part of the section summary. It is given every result and (where the summary has them)
 * every submission, each once, results and submissions in any order between them, and keeps only what
 * it draws: a course-wide file is summarised without holding its submissions.
 */
export interface KindSummaryPart<Submission = unknown, Refit = CheckResult['refit']> {
  addResult(result: KindResult<Refit>): void;
  addSubmission(submission: Submission): void;
  /** `withSubmissions`: the submissions were given (a summary may be drawn from the results alone). */
  draw(doc: Doc, withSubmissions: boolean): void;
}

/** What a part drawn from the whole section at once reads. */
export type SectionValues<Settings extends KindSettings = KindSettings, Submission = unknown, Refit = CheckResult['refit']> = Pick<SectionSummaryInput<Settings, Submission, Refit>, 'settings' | 'results' | 'submissions'>;

/** A part that keeps every result and submission and draws from them at the end: for a kind whose sections stay small. */
export function keepingEverything<Settings extends KindSettings, Submission, Refit>(
  settings: Settings,
  draw: (doc: Doc, values: SectionValues<Settings, Submission, Refit>) => void,
): KindSummaryPart<Submission, Refit> {
  const results: Array<KindResult<Refit>> = [];
  const submissions: Submission[] = [];
  return {
    addResult: (result) => void results.push(result),
    addSubmission: (submission) => void submissions.push(submission),
    draw: (doc, withSubmissions) => draw(doc, { settings, results, submissions: withSubmissions ? submissions : undefined }),
  };
}

/** A kind as the documents draw it: its report, and from its checker the stages and finding codes, in order. */
export interface DrawnKind {
  report: KindReport;
  stages: ReadonlyArray<{ id: string; title: string }>;
  findingCodes: readonly string[];
}
