import type { Refit, Settings, Submission } from '../schemas.ts';
import type { KindReport } from '../../../reports/kind-report.ts';
import { describePath } from './paths.ts';
import { drawRateLawPlot } from './rate-law-plot.ts';
import { rateLawSeries } from './rate-law-series.ts';
import { drawResidualPlots } from './residual-plots.ts';
import { rubricBreakdown } from './rubric-breakdown.ts';
import { drawRunPlots } from './run-plots.ts';
import { allRunSeries } from './run-series.ts';
import { drawValues } from './values-block.ts';
import { drawEquilibrium } from './equilibrium-block.ts';
import { readRefit } from './refit.ts';
import { firstOrderCatalysisDescription } from './description.ts';
import { firstOrderCatalysisDisplay } from './display.ts';
import { drawRateConstants } from './summary-rate-constants.ts';
import { drawEquilibriumSummary } from './summary-equilibrium.ts';
import { ClassTotals } from './class-values.ts';

/** Whether a submission has the runs a place in it may name (a refused one may not). */
function hasRuns(submission: unknown): submission is Pick<Submission, 'runs'> {
  return typeof submission === 'object' && submission !== null && 'runs' in submission && Array.isArray(submission.runs);
}

/**
 * The documents' parts for `first-order-catalysis`: reported against refit values, ln F against t per
 * run, k_obs against [catalyst] and residuals on the sheet; the class's k_N and k_A in the summary.
 */
export const firstOrderCatalysisReport: KindReport<Settings, Submission, Refit> = {
  description: firstOrderCatalysisDescription,
  // A refused submission may not have the shape of one; its places are then named as written.
  describePath: (path, submission) => describePath(path, hasRuns(submission) ? submission : undefined),
  rubricBreakdown,
  drawSheetData(doc, input) {
    const { settings, submission } = input;
    const refit = readRefit(input.result);
    if (!refit) return;
    drawValues(doc, settings, submission, refit);
    drawEquilibrium(doc, settings, submission, refit);
    const runs = allRunSeries(settings, submission.runs, refit, input.result.findings);
    drawRunPlots(doc, runs);
    const law = rateLawSeries(settings, submission, refit);
    if (law) drawRateLawPlot(doc, law);
    drawResidualPlots(doc, runs);
  },
  display: firstOrderCatalysisDisplay,
  summaryFacts: (settings) => [['Fit asked for', `ln F against t ${settings.fitModel === 'origin' ? 'through the origin' : 'with an intercept'}`]],
  summaryPart(settings) {
    const totals = new ClassTotals(settings);
    return {
      addResult: (result) => totals.addResult(result),
      addSubmission: (submission) => totals.addSubmission(submission),
      draw(doc, withSubmissions) {
        drawRateConstants(doc, settings, totals.values(), withSubmissions);
        drawEquilibriumSummary(doc, settings, totals.constants(), withSubmissions);
      },
    };
  },
};
