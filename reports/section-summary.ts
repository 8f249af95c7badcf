import type { SectionSummaryInput, SummaryHeader } from './feedback-input.ts';
import { INVENTED_NOTE } from './feedback-input.ts';
import type { SectionSignals } from '../server/signals/section-report.ts';
import { formatDate, formatPoints } from './format.ts';
import { collect, contentLeft, contentWidth, createDocument, finish, moveTo, paragraph, sectionHeading, type Doc } from './pdf/document.ts';
import { FONT } from './pdf/fonts.ts';
import { drawTable } from './pdf/table.ts';
import { COLOR, SIZE } from './pdf/theme.ts';
import { attentionRow } from './summary/attention.ts';
import { SectionTotals } from './summary/section-totals.ts';
import { drawScoreHistogram } from './summary/histogram.ts';
import { percentBins, spread } from './summary/stats.ts';
import { drawSignals } from './summary/signals-block.ts';
import type { DrawnKind } from './kind-report.ts';

export type { SectionSummaryInput, SummaryHeader } from './feedback-input.ts';
export { SectionTotals } from './summary/section-totals.ts';

/** What the summary is drawn from beside the section's totals. */
export interface SummaryFrame {
  header: SummaryHeader;
  /** The section's signals for review, where they were computed. */
  signals?: SectionSignals;
  invented?: boolean;
}

function drawHeader(doc: Doc, header: SummaryHeader, totals: SectionTotals): void {
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  const top = doc.page.margins.top;
  doc.save().rect(left, top, width, 3).fill(COLOR.accent).restore();
  doc.font(FONT.regular).fontSize(SIZE.small).fillColor(COLOR.muted).text('RATEPROOF · KINETICS ANALYSIS', left, top + 10, { lineBreak: false, characterSpacing: 0.8 });
  doc.font(FONT.bold).fontSize(SIZE.title).fillColor(COLOR.ink).text('Section summary', left, top + 22, { lineBreak: false });
  const { results, checked } = totals;
  const facts: Array<[string, string]> = [
    ['Course', header.course],
    ['Section', header.section],
    ['Assignment', header.assignment],
    ['Graded', formatDate(header.gradedAt)],
    ['Submissions', `${results} (${checked} checked, ${results - checked} not checked)`],
    ...totals.kind.report.summaryFacts(totals.settings),
  ];
  const third = width / 3;
  facts.forEach(([label, value], i) => {
    const x = left + (i % 3) * third;
    const y = top + 50 + Math.floor(i / 3) * 26;
    doc.font(FONT.regular).fontSize(SIZE.tiny).fillColor(COLOR.muted).text(label.toUpperCase(), x, y, { lineBreak: false, characterSpacing: 0.5 });
    doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink).text(value, x, y + 9, { width: third - 10, height: SIZE.body + 3, ellipsis: true, lineBreak: false });
  });
  moveTo(doc, top + 106);
  paragraph(doc, 'Findings name likely causes, not verdicts; a teaching assistant reviews them and can override any of them. Students are listed by pseudonymous id only.', {
    size: SIZE.small,
    color: COLOR.muted,
  });
}

function drawScores(doc: Doc, totals: SectionTotals): void {
  const { checked, fractions } = totals;
  sectionHeading(doc, 'Score distribution', 200);
  if (checked === 0) {
    paragraph(doc, 'No submission could be checked.');
    return;
  }
  const s = spread(fractions.map((f) => f * 100))!;
  paragraph(
    doc,
    `${checked} checked submission${checked === 1 ? '' : 's'}: mean ${s.mean.toFixed(1)} %, median ${s.median.toFixed(1)} %` +
      (Number.isFinite(s.sd) ? `, SD ${s.sd.toFixed(1)} %` : '') +
      `; lowest ${s.min.toFixed(0)} %, highest ${s.max.toFixed(0)} %.`,
  );
  drawScoreHistogram(doc, percentBins(fractions));
}

function drawCodes(doc: Doc, totals: SectionTotals): void {
  const counts = totals.codes.counts(totals.kind.findingCodes);
  const { checked } = totals;
  sectionHeading(doc, 'How often each finding occurred', 80);
  if (counts.length === 0) {
    paragraph(doc, 'No findings in this section.');
    return;
  }
  drawTable(
    doc,
    [
      { header: 'Finding code', weight: 2 },
      { header: 'Students', weight: 1, align: 'right' },
      { header: 'Share of checked', weight: 1.2, align: 'right' },
      { header: 'As an error', weight: 1, align: 'right' },
    ],
    counts.map((c) => [c.code, String(c.students), checked > 0 ? `${Math.round((c.students / checked) * 100)} %` : '—', String(c.asError)]),
    { zebra: true, keepRows: 4 },
  );
}

function drawAttention(doc: Doc, totals: SectionTotals): void {
  const list = totals.attention.list();
  sectionHeading(doc, 'Students who most need attention', 80);
  if (list.length === 0) {
    paragraph(doc, 'Every student has full points and nothing cost points.');
    return;
  }
  paragraph(doc, 'Not checked first, then the lowest share of the points, then the most causes costing points. Counted as on the feedback sheet: a slip repeated in several values and charged once counts once; warnings are those that cost nothing. Codes: error findings that cost points, most costly first.', { size: SIZE.small, color: COLOR.muted });
  drawTable(
    doc,
    [
      { header: 'Student id', weight: 1.3 },
      { header: 'Score', weight: 1, align: 'right' },
      { header: 'Causes costing points', weight: 0.9, align: 'right' },
      { header: 'Warnings', weight: 0.8, align: 'right' },
      { header: 'Main codes', weight: 3.4 },
    ],
    list.map(attentionRow),
    { zebra: true, keepRows: 4 },
  );
}

/**
 * A section at a glance, as PDF bytes: score distribution, the kind's part on the class's values (for
 * the first kind, k_N and k_A against the reference band), how often each finding occurred, who most needs a TA's attention (ids only), and
 * the section's signals for review where they are given.
 */
export async function renderSectionSummary(input: SectionSummaryInput, kind: DrawnKind): Promise<Buffer> {
  return renderSummaryOfTotals(SectionTotals.of(input, kind), input);
}

/** The same from totals gathered as the results came (a long file's, say). */
export async function renderSummaryOfTotals(totals: SectionTotals, { header, signals, invented }: SummaryFrame): Promise<Buffer> {
  const gradedAt = new Date(header.gradedAt);
  const doc = createDocument({ title: `Section summary ${header.section}`, date: Number.isNaN(gradedAt.getTime()) ? new Date(0) : gradedAt });
  const bytes = collect(doc);
  drawHeader(doc, header, totals);
  drawScores(doc, totals);
  drawAttention(doc, totals);
  totals.part.draw(doc, totals.withSubmissions);
  drawCodes(doc, totals);
  if (signals || totals.signalled.length > 0) drawSignals(doc, signals, totals.signalled, (path, studentId) => totals.place(path, studentId));
  finish(doc, {
    left: `Rateproof section summary · ${header.section} · ${formatPoints(totals.results)} students`,
    title: header.assignment,
    invented: invented ? INVENTED_NOTE : undefined,
  });
  return bytes;
}
