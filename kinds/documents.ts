import type { FeedbackInput, SectionSummaryInput } from '../reports/feedback-input.ts';
import { renderFeedbackSheet } from '../reports/feedback-sheet.ts';
import { renderSectionSummary, SectionTotals } from '../reports/section-summary.ts';
import type { KindSettings } from '../reports/feedback-input.ts';
import { renderSheetOrReason } from '../reports/sheet-or-reason.ts';
import { drawnKind } from './registry.ts';

// The documents of the kind their settings name: reports/ draws them for a kind it is given, and
// only here, above it, is the kind looked up by name.

export async function feedbackSheet(input: FeedbackInput): Promise<Buffer> {
  return renderFeedbackSheet(input, await drawnKind(input.settings.kind));
}

/** A sheet, or the page that says why it could not be drawn; a task of the worker pool. */
export async function feedbackSheetOrReason(input: FeedbackInput): Promise<Buffer> {
  return renderSheetOrReason(input, await drawnKind(input.settings.kind));
}

/** A section's summary; a task of the worker pool. */
export async function sectionSummary(input: SectionSummaryInput): Promise<Buffer> {
  return renderSectionSummary(input, await drawnKind(input.settings.kind));
}

/** A section's summary totals, to be given its results and submissions one at a time (a long file's, as they are checked). */
export async function sectionTotals(settings: KindSettings, withSubmissions: boolean): Promise<SectionTotals> {
  return new SectionTotals(await drawnKind(settings.kind), settings, withSubmissions);
}
