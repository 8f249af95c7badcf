import type { CheckResult } from '../../schemas/result.ts';
import type { KindSettings, SectionSummaryInput } from '../feedback-input.ts';
import type { DrawnKind, KindSummaryPart } from '../kind-report.ts';
import { scoreFraction } from '../result-summary.ts';
import { AttentionList } from './attention.ts';
import { CodeTally } from './code-counts.ts';

type Signalled = Pick<CheckResult, 'studentId' | 'signals'>;

/**
 * What the section summary draws, gathered one result and one submission at a time: counts, each
 * checked score, the students who most need attention so far, how often each code occurred, the
 * students with signals, and the kind's own part. A section of 20,000 is summarised without holding
 * its results or submissions.
 *
 * A result's signals are placed in words from the last submission given of its student: give each
 * result before (or with) its submission.
 */
export class SectionTotals {
  results = 0;
  checked = 0;
  /** Each checked result's share of the points, in the order given. */
  readonly fractions: number[] = [];
  readonly attention = new AttentionList();
  readonly codes = new CodeTally();
  /** The results with signals, in the order given. */
  readonly signalled: Signalled[] = [];
  readonly part: KindSummaryPart;
  private readonly signalledIds = new Set<string | undefined>();
  private readonly lastSubmission = new Map<string | undefined, unknown>();

  /** `withSubmissions`: the submissions are given (a summary may be drawn from the results alone). */
  constructor(
    readonly kind: DrawnKind,
    readonly settings: KindSettings,
    readonly withSubmissions: boolean,
  ) {
    this.part = kind.report.summaryPart(settings);
  }

  /** Totals of a whole section held in memory: the results, then the submissions. */
  static of(input: SectionSummaryInput, kind: DrawnKind): SectionTotals {
    const totals = new SectionTotals(kind, input.settings, input.submissions !== undefined);
    for (const result of input.results) totals.addResult(result);
    for (const submission of input.submissions ?? []) totals.addSubmission(submission);
    return totals;
  }

  addResult(result: CheckResult): void {
    this.results += 1;
    if (result.status === 'checked') {
      this.checked += 1;
      this.fractions.push(scoreFraction(result));
    }
    this.attention.add(result);
    this.codes.add(result);
    if ((result.signals ?? []).length > 0) {
      this.signalled.push({ studentId: result.studentId, signals: result.signals });
      this.signalledIds.add(result.studentId ?? undefined);
    }
    this.part.addResult(result);
  }

  addSubmission(submission: unknown): void {
    const id = (submission as { studentId?: string }).studentId;
    if (this.signalledIds.has(id)) this.lastSubmission.set(id, submission);
    this.part.addSubmission(submission);
  }

  /** A signal's place in words, from the student's submission where it was given. */
  place(path: string, studentId: string | null): string {
    return this.kind.report.describePath(path, this.lastSubmission.get(studentId ?? undefined));
  }
}
