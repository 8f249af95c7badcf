import type { CheckResult } from '../../schemas/result.ts';
import { formatPoints } from '../format.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, sectionHeading, type Doc } from '../pdf/document.ts';
import { FONT } from '../pdf/fonts.ts';
import { drawTable } from '../pdf/table.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';
import type { RubricLine } from './rubric-lines.ts';
import { cardCounts, countsInWords } from './finding-groups.ts';

/** The score in large type with a bar, the findings counted as the sheet shows them, and the rubric items it is made of. */
export function drawScore(doc: Doc, result: CheckResult, lines: RubricLine[]): void {
  sectionHeading(doc, 'Score', 120);
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  const top = doc.y;
  const score = result.score ?? 0;
  const scoreText = `${formatPoints(score)} / ${formatPoints(result.maxScore)}`;
  doc.font(FONT.bold).fontSize(24).fillColor(COLOR.ink).text(scoreText, left, top, { lineBreak: false });
  const scoreWidth = doc.widthOfString(scoreText);
  doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.muted).text('points', left + scoreWidth + 6, top + 12, { lineBreak: false });

  const barX = left + 190;
  const barWidth = width - 190;
  const fraction = result.maxScore > 0 ? Math.max(0, Math.min(1, score / result.maxScore)) : 0;
  doc.save().roundedRect(barX, top + 6, barWidth, 9, 4.5).fill(COLOR.grid).restore();
  if (fraction > 0) doc.save().roundedRect(barX, top + 6, Math.max(9, barWidth * fraction), 9, 4.5).fill(COLOR.accent).restore();
  doc.font(FONT.regular).fontSize(SIZE.small).fillColor(COLOR.ink);
  doc.text(`${Math.round(fraction * 100)} % of the points · ${countsInWords(cardCounts(result.findings))}`, barX, top + 20, { lineBreak: false });
  moveTo(doc, top + 38);

  ensureSpace(doc, 40);
  const rows = lines.map((l) => [
    l.label,
    l.count > 1 ? `${formatPoints(l.each)} × ${l.count} runs` : formatPoints(l.available),
    formatPoints(l.available),
    l.lost > 0 ? `−${formatPoints(l.lost)}` : '0',
    formatPoints(l.earned),
  ]);
  rows.push(['Total', '', formatPoints(result.maxScore), result.maxScore - score > 0 ? `−${formatPoints(result.maxScore - score)}` : '0', formatPoints(score)]);
  drawTable(
    doc,
    [
      { header: 'Rubric item', weight: 3.2 },
      { header: 'Worth', weight: 1.6, align: 'right' },
      { header: 'Available', weight: 1.1, align: 'right' },
      { header: 'Lost', weight: 1, align: 'right' },
      { header: 'Earned', weight: 1.1, align: 'right' },
    ],
    rows,
    { boldRows: new Set([rows.length - 1]), zebra: true, keepRows: rows.length },
  );
}
