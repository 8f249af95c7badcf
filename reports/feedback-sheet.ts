import type { FeedbackInput } from './feedback-input.ts';
import { INVENTED_NOTE } from './feedback-input.ts';
import { drawFindings, drawRejections } from './feedback/findings-block.ts';
import { drawHeader } from './feedback/header-block.ts';
import { drawMeasurementNotes } from './feedback/measurement-notes-block.ts';
import { drawRateLawPlot } from './feedback/rate-law-plot.ts';
import { rateLawSeries } from './feedback/rate-law-series.ts';
import { drawResidualPlots } from './feedback/residual-plots.ts';
import { rubricBreakdown } from './feedback/rubric-breakdown.ts';
import { drawRunPlots } from './feedback/run-plots.ts';
import { allRunSeries } from './feedback/run-series.ts';
import { drawScore } from './feedback/score-block.ts';
import { drawValues } from './feedback/values-block.ts';
import { collect, createDocument, finish } from './pdf/document.ts';
import { readRefit } from './refit.ts';

export type { FeedbackHeader, FeedbackInput } from './feedback-input.ts';

/**
 * One student's feedback sheet as PDF bytes: header, score and its rubric items, findings by stage in
 * the checker's words, reported against refit values, and vector plots (ln F against t per run,
 * k_obs against [catalyst], residuals where a reading looks suspect), and the signals about the
 * measurement a TA chose to share. Pure: data in, bytes out.
 */
export async function renderFeedbackSheet(input: FeedbackInput): Promise<Buffer> {
  const { header, settings, submission, result } = input;
  const gradedAt = new Date(header.gradedAt);
  const doc = createDocument({ title: `Feedback sheet ${header.studentId}`, date: Number.isNaN(gradedAt.getTime()) ? new Date(0) : gradedAt });
  const bytes = collect(doc);

  drawHeader(doc, header, result.engineVersion);
  const refit = result.status === 'checked' ? readRefit(result) : undefined;
  if (result.status === 'rejected') {
    drawRejections(doc, result, Array.isArray(submission?.runs) ? submission : undefined);
  } else {
    drawScore(doc, result, rubricBreakdown(settings, submission, result));
    drawFindings(doc, result, submission);
    drawMeasurementNotes(doc, result, submission);
    if (refit) {
      drawValues(doc, settings, submission, refit);
      const runs = allRunSeries(settings, submission.runs, refit, result.findings);
      drawRunPlots(doc, runs);
      const law = rateLawSeries(settings, submission, refit);
      if (law) drawRateLawPlot(doc, law);
      drawResidualPlots(doc, runs);
    }
  }

  finish(doc, {
    left: `Rateproof feedback · ${header.studentId} · ${header.assignment} · version ${header.version}`,
    invented: input.invented ? INVENTED_NOTE : undefined,
  });
  return bytes;
}
