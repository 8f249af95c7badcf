import type { FeedbackInput } from './feedback-input.ts';
import { INVENTED_NOTE } from './feedback-input.ts';
import { drawHeader } from './feedback/header-block.ts';
import { collect, createDocument, finish, paragraph, sectionHeading } from './pdf/document.ts';

/**
 * The page that stands in for a feedback sheet that could not be drawn, so that a section's ZIP still
 * holds every student and says why one sheet is missing. The result itself is stored and unchanged.
 */
export async function renderUndrawableSheet(input: FeedbackInput, reason: string): Promise<Buffer> {
  const { header, result } = input;
  const doc = createDocument({ title: `Feedback sheet ${header.studentId}`, date: new Date(0) });
  const bytes = collect(doc);
  drawHeader(doc, header, result.engineVersion);
  sectionHeading(doc, 'This sheet could not be drawn');
  paragraph(
    doc,
    `The result of this submission is stored${result.score === null ? '' : ` (${result.score} of ${result.maxScore} points)`}, but its feedback sheet could not be drawn: ${reason}. ` +
      'A teaching assistant can see every finding in the service and download this sheet again once the cause is mended.',
  );
  finish(doc, { left: `Rateproof feedback · ${header.studentId} · version ${header.version}`, title: header.assignment, invented: input.invented ? INVENTED_NOTE : undefined });
  return bytes;
}
