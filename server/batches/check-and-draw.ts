import { feedbackSheetOrReason } from '../../kinds/documents.ts';
import type { KindSettings, SummaryHeader } from '../../reports/feedback-input.ts';
import { checkJsonBatch, type CheckedBatch, type CheckJsonBatchInput } from './check-json-batch.ts';
import { sheetParts } from './sheet-parts.ts';
import { withMoved } from './moved-buffers.ts';

export interface CheckAndDrawInput extends CheckJsonBatchInput {
  header: SummaryHeader;
  settings: KindSettings;
}

/**
 * A batch checked and its sheets drawn: what `check --out` prints and keeps, and each sheet's student
 * and bytes, in order; the results and submissions as given only where `keep.submissions` asks (--signals).
 */
export interface DrawnBatch extends Omit<CheckedBatch, 'reads'> {
  /** Per result, in order: the JSON line the gradebook and summary read back. */
  kept: string;
  sheets: Array<{ studentId: string; bytes: Uint8Array }>;
}

/**
 * `check --out` in a worker: a batch checked and its sheets drawn in the same thread, so that its
 * results and submissions never travel to the command's thread and back (that thread's heap then
 * holds little more than the batches' text), and only the sheets' bytes and the kept lines return.
 */
export async function checkAndDraw(input: CheckAndDrawInput): Promise<DrawnBatch> {
  const withSubmissions = input.keep?.submissions ?? false;
  const { results = [], reads = [], submissions, ...printed } = checkJsonBatch({ ...input, keep: { reads: true, submissions: withSubmissions } });
  let kept = '';
  const sheets: DrawnBatch['sheets'] = [];
  for (const [i, result] of results.entries()) {
    const parts = sheetParts(input.header, input.settings, result, reads[i]);
    kept += `${JSON.stringify(parts.kept)}\n`;
    if (parts.input) sheets.push({ studentId: parts.input.header.studentId, bytes: await feedbackSheetOrReason(parts.input) });
  }
  const drawn = { ...printed, kept, sheets, ...(withSubmissions ? { results, submissions } : {}) };
  return withMoved(drawn, sheets.map((s) => s.bytes));
}
