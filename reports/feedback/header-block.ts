import { formatDate } from '../format.ts';
import { contentLeft, contentWidth, moveTo, type Doc } from '../pdf/document.ts';
import { FONT } from '../pdf/fonts.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';
import type { FeedbackHeader } from '../feedback-input.ts';
import { DRAFT_NOTE, LIKELY_CAUSES_NOTE } from '../feedback-input.ts';

/** Title, the student's id, the grading's facts in a grid, and the note on what a diagnosis is. */
export function drawHeader(doc: Doc, header: FeedbackHeader, engineVersion: string): void {
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  const top = doc.page.margins.top;
  doc.save().rect(left, top, width, 3).fill(COLOR.accent).restore();

  doc.font(FONT.regular).fontSize(SIZE.small).fillColor(COLOR.muted);
  doc.text('RATEPROOF · KINETICS ANALYSIS', left, top + 10, { lineBreak: false, characterSpacing: 0.8 });
  doc.font(FONT.bold).fontSize(SIZE.title).fillColor(COLOR.ink);
  doc.text('Feedback sheet', left, top + 22, { lineBreak: false });

  // The id in a box at the right: the one thing a student looks for first.
  const idText = header.studentId;
  doc.font(FONT.bold).fontSize(14);
  const idWidth = Math.max(110, doc.widthOfString(idText) + 24);
  const boxX = left + width - idWidth;
  doc.save().roundedRect(boxX, top + 10, idWidth, 36, 3).fill(COLOR.accentLight).restore();
  doc.font(FONT.regular).fontSize(SIZE.tiny).fillColor(COLOR.accent);
  doc.text('STUDENT ID', boxX + 12, top + 15, { lineBreak: false, characterSpacing: 0.6 });
  doc.font(FONT.bold).fontSize(14).fillColor(COLOR.ink);
  doc.text(idText, boxX + 12, top + 25, { lineBreak: false });

  const facts: Array<[string, string]> = [
    ['Course', header.course],
    ['Section', header.section],
    ['Assignment', header.assignment],
    ['Graded', formatDate(header.gradedAt)],
    ['Submission version', header.version === 1 ? '1 (first submission)' : `${header.version} (resubmitted)`],
    ['Checker version', engineVersion],
  ];
  const gridTop = top + 58;
  const columnWidth = width / 3;
  // Values wrap (a long assignment title takes the lines it needs); each row is as tall as its tallest value.
  doc.font(FONT.regular).fontSize(SIZE.body);
  const valueHeight = ([, value]: [string, string]) => doc.heightOfString(value, { width: columnWidth - 12 });
  const rowHeights = [facts.slice(0, 3), facts.slice(3)].map((row) => 9 + Math.max(SIZE.body + 2.5, ...row.map(valueHeight)) + 6);
  facts.forEach(([label, value], i) => {
    const x = left + (i % 3) * columnWidth;
    const y = gridTop + (i < 3 ? 0 : rowHeights[0]);
    doc.font(FONT.regular).fontSize(SIZE.tiny).fillColor(COLOR.muted).text(label.toUpperCase(), x, y, { lineBreak: false, characterSpacing: 0.5 });
    doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink).text(value, x, y + 9, { width: columnWidth - 12 });
  });

  const noteTop = gridTop + rowHeights[0] + rowHeights[1] + 2;
  const note = header.released === false ? `${LIKELY_CAUSES_NOTE} ${DRAFT_NOTE}` : LIKELY_CAUSES_NOTE;
  doc.font(FONT.regular).fontSize(SIZE.small);
  const noteHeight = doc.heightOfString(note, { width: width - 24 }) + 12;
  doc.save().rect(left, noteTop, width, noteHeight).fill(COLOR.panel).restore();
  doc.save().rect(left, noteTop, 3, noteHeight).fill(COLOR.accent).restore();
  doc.fillColor(COLOR.ink).text(note, left + 12, noteTop + 6, { width: width - 24 });
  moveTo(doc, noteTop + noteHeight + 6);
}
