import type { CheckResult } from '../../schemas/result.ts';
import { contentLeft, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../pdf/document.ts';
import { drawRich } from '../pdf/rich-text.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';
import { sheetMessage, type DescribePath } from './finding-text.ts';

/** The signals a TA chose to share with the student, as notes about the measurement; drawn only where there are some. */
export function drawMeasurementNotes(doc: Doc, result: CheckResult, describe: DescribePath): void {
  const chosen = (result.signals ?? []).filter((s) => s.onSheet);
  if (chosen.length === 0) return;
  sectionHeading(doc, 'Notes on the measurement', 60);
  paragraph(doc, 'Your teaching assistant chose to share these observations about how the data look. They are prompts to talk about the experiment, not findings, and cost no points.', {
    size: SIZE.small,
    color: COLOR.muted,
  });
  for (const s of chosen) {
    // The place and at least three lines of its note stay together.
    ensureSpace(doc, 14 + 3 * 12);
    const y = doc.y;
    drawRich(doc, describe(s.path), contentLeft(doc), y, { size: SIZE.body, bold: true, color: COLOR.ink });
    moveTo(doc, y + 14);
    paragraph(doc, sheetMessage(s.message, describe), { gap: 7 });
  }
}
