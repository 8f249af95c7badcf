import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings, SummaryHeader } from '../../reports/feedback-input.ts';
import { withoutArrays } from './check-json-batch.ts';

/** What the gradebook and the summary read of a result: no rubric items, per-reading arrays or finding messages. */
export function summaryPart(result: CheckResult): CheckResult {
  const { items: _items, ...rest } = withoutArrays(result);
  return { ...rest, findings: rest.findings.map((f) => ({ ...f, message: '' })) };
}

/** A result kept for `check --out`'s gradebook and summary: its summary part, with the submission as read where it has a sheet. */
export type KeptResult = [CheckResult] | [CheckResult, unknown];

/**
 * A checked result's sheet input, or undefined where it gets no sheet (not checked, no student id, or
 * no submission as read); and what the summary keeps of it.
 */
export function sheetParts(header: SummaryHeader, settings: KindSettings, result: CheckResult, read: unknown): { kept: KeptResult; input?: FeedbackInput } {
  if (result.status !== 'checked' || result.studentId === null || read === undefined) return { kept: [summaryPart(result)] };
  return { kept: [summaryPart(result), read], input: { header: { ...header, studentId: result.studentId, version: 1 }, settings, submission: read, result } };
}
