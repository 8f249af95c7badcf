import type { CheckResult, Finding } from '../../schemas/result.ts';
import { printableMessage } from '../format.ts';
import { cardCodes, cardWhere, followsFromOwnText, pointsText, pointsWord, sheetMessage, valuesAt, type DescribePath } from './finding-text.ts';
import { groupFindings, type FindingCard } from './finding-groups.ts';
import { SEVERITY_WORD } from '../labels.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../pdf/document.ts';
import { marker, type MarkerShape } from '../pdf/marks.ts';
import { drawRich, richWidth } from '../pdf/rich-text.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';

/** The kind's stages in order with their titles. */
export type Stages = ReadonlyArray<{ id: string; title: string }>;

/** Severity in words and in shape, never by colour alone. */
export const SEVERITY_STYLE: Record<Finding['severity'], { shape: MarkerShape; color: string }> = {
  error: { shape: 'square', color: COLOR.error },
  warning: { shape: 'triangle', color: COLOR.warning },
  info: { shape: 'ring', color: COLOR.info },
};

const INDENT = 16;

function drawOverride(doc: Doc, f: Finding): void {
  const override = (f as OverriddenFinding).override;
  if (!override) return;
  // The reason is the TA's note for the audit trail unless the TA chose to show it to the student.
  const reason = override.reasonShown ? ` Reason: ${override.reason}` : '';
  paragraph(doc, `Reviewed by a teaching assistant: the points were changed from ${pointsWord(override.originalPointsLost)} lost.${reason}`, { indent: INDENT, gap: 4, bold: true });
}

/** One likely cause: where it first shows, its message, then every other place it shows. */
function drawCard(doc: Doc, card: FindingCard, describe: DescribePath): void {
  const [first, ...others] = card.members;
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  // The headline and at least three lines of its message stay together.
  ensureSpace(doc, 16 + 3 * 12);
  const y = doc.y;
  const style = SEVERITY_STYLE[card.severity];
  marker(doc, style.shape, left + 5, y + 5.5, 6.5, style.color);
  let x = left + INDENT;
  x += drawRich(doc, SEVERITY_WORD[card.severity], x, y, { size: SIZE.body, bold: true, color: style.color });
  const where = cardWhere(card, describe);
  x += drawRich(doc, `  ·  ${where}`, x, y, { size: SIZE.body, bold: true, color: COLOR.ink });
  const codes = cardCodes(first);
  const right = pointsText(card.pointsLost);
  const rightWidth = richWidth(doc, right, SIZE.small, card.pointsLost > 0);
  drawRich(doc, right, left + width, y + 1, { size: SIZE.small, bold: card.pointsLost > 0, color: card.pointsLost > 0 ? COLOR.error : COLOR.muted, align: 'right' });
  const codeRoom = left + width - rightWidth - 10 - (x + 8);
  if (richWidth(doc, codes, SIZE.tiny) <= codeRoom) drawRich(doc, codes, x + 8, y + 2, { size: SIZE.tiny, color: COLOR.muted });
  moveTo(doc, y + 13);
  if (richWidth(doc, codes, SIZE.tiny) > codeRoom) paragraph(doc, codes, { size: SIZE.tiny, color: COLOR.muted, indent: INDENT, gap: 1 });
  paragraph(doc, sheetMessage(first.message, describe), { indent: INDENT, gap: 2 });
  drawOverride(doc, first);
  if (others.length > 0) {
    const charged = others.filter((f) => f.pointsLost > 0).length;
    const lead = charged === 0 ? 'The same likely cause also shows here, counted once (no further points lost):' : 'The same likely cause also shows here:';
    paragraph(doc, lead, { indent: INDENT, gap: 1 });
    for (const f of others) {
      const cost = f.pointsLost > 0 ? ` (${pointsText(f.pointsLost)})` : '';
      paragraph(doc, `•  ${describe(f.path)}${printableMessage(`${valuesAt(f)}${cost}`)}`, { indent: INDENT + 8, gap: 1 });
      drawOverride(doc, f);
    }
  }
  doc.y += 7;
}

/** Values that only follow from the student's own earlier numbers at no cost: one short line. */
function drawFollowsFromOwn(doc: Doc, findings: Finding[], describe: DescribePath): void {
  if (findings.length === 0) return;
  paragraph(doc, followsFromOwnText(findings, describe), {
    size: SIZE.small,
    color: COLOR.muted,
    gap: 7,
  });
}

/** A finding whose points a TA changed, as the service passes it on (reports need not know the service). */
interface OverriddenFinding extends Finding {
  override?: { originalPointsLost: number; reason: string; reasonShown?: boolean };
}

/** The findings under each stage's heading, one card per likely cause, in the checker's order and words. */
export function drawFindings(doc: Doc, result: CheckResult, stages: Stages, describe: DescribePath): void {
  sectionHeading(doc, 'Findings', 50);
  if (result.findings.length === 0) {
    paragraph(doc, 'No findings: every value checked agrees with the refit from your data within the tolerances.');
    return;
  }
  const groups = groupFindings(result.findings);
  for (const stage of stages) {
    const cards = groups.cards.filter((c) => c.members[0].stage === stage.id);
    const followsFromOwn = groups.followsFromOwn.filter((f) => f.stage === stage.id);
    if (cards.length === 0 && followsFromOwn.length === 0) continue;
    ensureSpace(doc, 60);
    const y = doc.y + 2;
    drawRich(doc, stage.title, contentLeft(doc), y, { size: SIZE.subheading, bold: true, color: COLOR.accent });
    const count = cards.length === 0 ? 'no points lost' : `${cards.length} ${cards.length === 1 ? 'finding' : 'findings'}`;
    drawRich(doc, count, contentLeft(doc) + contentWidth(doc), y + 1.5, { size: SIZE.small, color: COLOR.muted, align: 'right' });
    doc.save().moveTo(contentLeft(doc), y + 15).lineTo(contentLeft(doc) + contentWidth(doc), y + 15).lineWidth(0.4).strokeColor(COLOR.rule).stroke().restore();
    moveTo(doc, y + 20);
    for (const card of cards) drawCard(doc, card, describe);
    drawFollowsFromOwn(doc, followsFromOwn, describe);
  }
}

/** For a rejected submission: what could not be used, and why. */
export function drawRejections(doc: Doc, result: CheckResult, describe: DescribePath): void {
  sectionHeading(doc, 'Not checked', 50);
  paragraph(doc, 'This submission could not be analysed, so it has not been scored. Each problem below names the field and the reason; once it is corrected the submission can be checked.');
  for (const r of result.rejected ?? []) {
    ensureSpace(doc, 30);
    const y = doc.y;
    marker(doc, 'square', contentLeft(doc) + 5, y + 5.5, 6.5, COLOR.error);
    drawRich(doc, `Error  ·  ${describe(r.path)}`, contentLeft(doc) + INDENT, y, { size: SIZE.body, bold: true, color: COLOR.ink });
    moveTo(doc, y + 13);
    paragraph(doc, sheetMessage(r.message, describe), { indent: INDENT, gap: 7 });
  }
}
