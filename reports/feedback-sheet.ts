import type { FeedbackInput } from './feedback-input.ts';
import type { DrawnKind } from './kind-report.ts';
import { INVENTED_NOTE } from './feedback-input.ts';
import { drawFindings, drawRejections } from './feedback/findings-block.ts';
import { drawHeader } from './feedback/header-block.ts';
import { drawMeasurementNotes } from './feedback/measurement-notes-block.ts';
import { drawScore } from './feedback/score-block.ts';
import { collect, createDocument, finish } from './pdf/document.ts';

export type { FeedbackHeader, FeedbackInput } from './feedback-input.ts';

/**
 * One student's feedback sheet as PDF bytes: header, score and its rubric items, findings by stage in
 * the checker's words, the signals about the measurement a TA chose to share, then the kind's own
 * part (its reported against refit values and its plots, drawn by its KindReport). Pure: data in, bytes out.
 */
export async function renderFeedbackSheet(input: FeedbackInput, kind: DrawnKind): Promise<Buffer> {
  const { header, settings, submission, result } = input;
  const gradedAt = new Date(header.gradedAt);
  const doc = createDocument({ title: `Feedback sheet ${header.studentId}`, date: Number.isNaN(gradedAt.getTime()) ? new Date(0) : gradedAt });
  const bytes = collect(doc);

  const { report } = kind;
  const describe = (path: string) => report.describePath(path, submission);
  drawHeader(doc, header, result.engineVersion);
  if (result.status === 'rejected') {
    drawRejections(doc, result, describe);
  } else {
    drawScore(doc, result, report.rubricBreakdown(settings, submission, result));
    drawFindings(doc, result, kind.stages, describe);
    drawMeasurementNotes(doc, result, describe);
    if (result.status === 'checked') report.drawSheetData(doc, input);
  }

  finish(doc, {
    left: `Rateproof feedback · ${header.studentId} · version ${header.version}`,
    title: header.assignment,
    invented: input.invented ? INVENTED_NOTE : undefined,
  });
  return bytes;
}
