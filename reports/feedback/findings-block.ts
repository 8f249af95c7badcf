import type { CheckResult, Finding } from '../../schemas/result.ts';
import { formatPoints, printableMessage } from '../format.ts';
import { SEVERITY_WORD } from '../labels.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../pdf/document.ts';
import { marker, type MarkerShape } from '../pdf/marks.ts';
import { drawRich, richWidth } from '../pdf/rich-text.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';

/** A finding's place in words (the kind's), and the kind's stages in order with their titles. */
export type DescribePath = (path: string) => string;
export type Stages = ReadonlyArray<{ id: string; title: string }>;

/** Severity in words and in shape, never by colour alone. */
export const SEVERITY_STYLE: Record<Finding['severity'], { shape: MarkerShape; color: string }> = {
  error: { shape: 'square', color: COLOR.error },
  warning: { shape: 'triangle', color: COLOR.warning },
  info: { shape: 'ring', color: COLOR.info },
};

const INDENT = 16;

function pointsText(f: Finding): string {
  if (f.pointsLost > 0) return `−${formatPoints(f.pointsLost)} ${f.pointsLost === 1 ? 'point' : 'points'}`;
  return 'no points lost';
}

function drawFinding(doc: Doc, f: Finding, describe: DescribePath): void {
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  // The headline and at least three lines of its message stay together.
  ensureSpace(doc, 16 + 3 * 12);
  const y = doc.y;
  const style = SEVERITY_STYLE[f.severity];
  marker(doc, style.shape, left + 5, y + 5.5, 6.5, style.color);
  const word = SEVERITY_WORD[f.severity];
  let x = left + INDENT;
  x += drawRich(doc, word, x, y, { size: SIZE.body, bold: true, color: style.color });
  x += drawRich(doc, `  ·  ${describe(f.path)}`, x, y, { size: SIZE.body, bold: true, color: COLOR.ink });
  const codes = [f.code, ...(f.alsoCodes ?? [])].join(' + ') + (f.detail ? ` (${f.detail})` : '');
  const right = pointsText(f);
  const rightWidth = richWidth(doc, right, SIZE.small, f.pointsLost > 0);
  drawRich(doc, right, left + width, y + 1, { size: SIZE.small, bold: f.pointsLost > 0, color: f.pointsLost > 0 ? COLOR.error : COLOR.muted, align: 'right' });
  const codeRoom = left + width - rightWidth - 10 - (x + 8);
  if (richWidth(doc, codes, SIZE.tiny) <= codeRoom) drawRich(doc, codes, x + 8, y + 2, { size: SIZE.tiny, color: COLOR.muted });
  moveTo(doc, y + 13);
  if (richWidth(doc, codes, SIZE.tiny) > codeRoom) paragraph(doc, codes, { size: SIZE.tiny, color: COLOR.muted, indent: INDENT, gap: 1 });
  const override = (f as OverriddenFinding).override;
  paragraph(doc, printableMessage(f.message), { indent: INDENT, gap: override ? 2 : 7 });
  if (override) {
    const was = `${formatPoints(override.originalPointsLost)} ${override.originalPointsLost === 1 ? 'point' : 'points'}`;
    paragraph(doc, `Reviewed by a teaching assistant: the points were changed from ${was} lost. Reason: ${override.reason}`, { indent: INDENT, gap: 7, bold: true });
  }
}

/** A finding whose points a TA changed, as the service passes it on (reports need not know the service). */
interface OverriddenFinding extends Finding {
  override?: { originalPointsLost: number; reason: string };
}

/** The findings under each stage's heading, in the checker's order and words. */
export function drawFindings(doc: Doc, result: CheckResult, stages: Stages, describe: DescribePath): void {
  sectionHeading(doc, 'Findings', 50);
  if (result.findings.length === 0) {
    paragraph(doc, 'No findings: every value checked agrees with the refit from your data within the tolerances.');
    return;
  }
  for (const stage of stages) {
    const findings = result.findings.filter((f) => f.stage === stage.id);
    if (findings.length === 0) continue;
    ensureSpace(doc, 60);
    const y = doc.y + 2;
    drawRich(doc, stage.title, contentLeft(doc), y, { size: SIZE.subheading, bold: true, color: COLOR.accent });
    const count = `${findings.length} ${findings.length === 1 ? 'finding' : 'findings'}`;
    drawRich(doc, count, contentLeft(doc) + contentWidth(doc), y + 1.5, { size: SIZE.small, color: COLOR.muted, align: 'right' });
    doc.save().moveTo(contentLeft(doc), y + 15).lineTo(contentLeft(doc) + contentWidth(doc), y + 15).lineWidth(0.4).strokeColor(COLOR.rule).stroke().restore();
    moveTo(doc, y + 20);
    for (const f of findings) drawFinding(doc, f, describe);
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
    paragraph(doc, printableMessage(r.message), { indent: INDENT, gap: 7 });
  }
}
