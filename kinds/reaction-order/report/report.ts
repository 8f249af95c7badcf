import type { Refit, Settings, Submission } from '../schemas.ts';
import type { KindReport } from '../../../reports/kind-report.ts';
import { formatReported, prettyUnit } from '../../../reports/format.ts';
import { rubricLinesOf } from '../../../reports/feedback/rubric-lines.ts';
import { classOrdersAndK } from './class-summary.ts';
import { reactionOrderDescription } from './description.ts';
import { reactionOrderDisplay } from './display.ts';
import { describePath, hasRuns } from './paths.ts';
import { drawSheetData } from './sheet-data.ts';

/** Labels by rubric item; a plain record, so that an item the schema adds later prints its own name until worded. */
const RUBRIC_LABELS: Readonly<Record<string, string>> = {
  order: 'Order n',
  k: 'k',
  kUncertainty: 'Standard error of k',
  kUnit: 'Unit of k fits the order',
  halfLife: 'Half-life t_{1/2}, per run',
  sigFigs: 'Significant figures',
};

/** The signal as the summary's header names it, in one short plain line (the header prints no markup and cuts long text). */
function signalFact(signal: Settings['signal']): string {
  if (signal.type === 'absorbance') return `absorbance, ε ${formatReported(signal.molarAbsorptivity.value)} ${prettyUnit(signal.molarAbsorptivity.unit)}`;
  return `${signal.type} in ${prettyUnit(signal.unit)}`;
}

/**
 * The documents' parts for `reaction-order`: the order and k against ours, each order's fit and its
 * straight-line plot, the half-lives on the sheet; the class's orders and k in the summary.
 */
export const reactionOrderReport: KindReport<Settings, Submission, Refit> = {
  description: reactionOrderDescription,
  describePath: (path, submission) => describePath(path, hasRuns(submission) ? submission : undefined),
  rubricBreakdown: (_settings, _submission, result) => rubricLinesOf(result, RUBRIC_LABELS),
  drawSheetData,
  display: reactionOrderDisplay,
  summaryFacts: (settings) => [['Signal', signalFact(settings.signal)]],
  summaryPart: classOrdersAndK,
};
