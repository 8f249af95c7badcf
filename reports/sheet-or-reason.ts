import type { FeedbackInput } from './feedback-input.ts';
import { renderFeedbackSheet } from './feedback-sheet.ts';
import type { DrawnKind } from './kind-report.ts';
import { renderUndrawableSheet } from './undrawable-sheet.ts';

/**
 * A student's feedback sheet; where drawing it fails, the page that says why in its place. A result
 * that is stored always gets a PDF, and a section's ZIP is never cut short by one student's data.
 */
export async function renderSheetOrReason(input: FeedbackInput, kind: DrawnKind): Promise<Buffer> {
  try {
    return await renderFeedbackSheet(input, kind);
  } catch (error) {
    return renderUndrawableSheet(input, (error as Error).message || 'an error in the drawing');
  }
}
