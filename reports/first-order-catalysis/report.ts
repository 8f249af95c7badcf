import type { Settings, Submission } from '../../schemas/kinds/first-order-catalysis.ts';
import type { KindReport } from '../kind-report.ts';
import { describePath } from '../feedback/paths.ts';
import { drawRateLawPlot } from '../feedback/rate-law-plot.ts';
import { rateLawSeries } from '../feedback/rate-law-series.ts';
import { drawResidualPlots } from '../feedback/residual-plots.ts';
import { rubricBreakdown } from '../feedback/rubric-breakdown.ts';
import { drawRunPlots } from '../feedback/run-plots.ts';
import { allRunSeries } from '../feedback/run-series.ts';
import { drawValues } from '../feedback/values-block.ts';
import { readRefit } from '../refit.ts';
import { firstOrderCatalysisDescription } from './description.ts';
import { firstOrderCatalysisDisplay } from './display.ts';
import { drawRateConstants } from './summary-rate-constants.ts';

/**
 * The documents' parts for `first-order-catalysis`: reported against refit values, ln F against t per
 * run, k_obs against [catalyst] and residuals on the sheet; the class's k_N and k_A in the summary.
 */
export const firstOrderCatalysisReport: KindReport = {
  description: firstOrderCatalysisDescription,
  // A refused submission may not have the shape of one; its places are then named as written.
  describePath: (path, submission) => describePath(path, Array.isArray((submission as Partial<Submission> | undefined)?.runs) ? (submission as Submission) : undefined),
  rubricBreakdown: (settings, submission, result) => rubricBreakdown(settings as Settings, submission as Submission, result),
  drawSheetData(doc, input) {
    const settings = input.settings as Settings;
    const submission = input.submission as Submission;
    const refit = readRefit(input.result);
    if (!refit) return;
    drawValues(doc, settings, submission, refit);
    const runs = allRunSeries(settings, submission.runs, refit, input.result.findings);
    drawRunPlots(doc, runs);
    const law = rateLawSeries(settings, submission, refit);
    if (law) drawRateLawPlot(doc, law);
    drawResidualPlots(doc, runs);
  },
  display: firstOrderCatalysisDisplay,
  summaryFacts: (settings) => [['Fit asked for', `ln F against t ${(settings as Settings).fitModel === 'origin' ? 'through the origin' : 'with an intercept'}`]],
  drawSummaryData: drawRateConstants,
};
