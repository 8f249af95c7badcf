import type { SectionSummaryInput } from './feedback-input.ts';
import { INVENTED_NOTE } from './feedback-input.ts';
import { formatDate, formatNumber, formatPoints, prettyUnit } from './format.ts';
import { collect, contentLeft, contentWidth, createDocument, ensureSpace, finish, moveTo, paragraph, sectionHeading, type Doc } from './pdf/document.ts';
import { FONT } from './pdf/fonts.ts';
import { drawTable } from './pdf/table.ts';
import { COLOR, SIZE } from './pdf/theme.ts';
import { scoreFraction } from './result-summary.ts';
import { attentionRow, needAttention } from './summary/attention.ts';
import { classValues, type ClassValues } from './summary/class-values.ts';
import { codeCounts } from './summary/code-counts.ts';
import { drawScoreHistogram } from './summary/histogram.ts';
import { percentBins, spread } from './summary/stats.ts';
import { drawSignals } from './summary/signals-block.ts';
import { drawStripPlot } from './summary/strip-plot.ts';

export type { SectionSummaryInput, SummaryHeader } from './feedback-input.ts';

const SYMBOL = { kN: 'k_{N}', kA: 'k_{A}' } as const;

function drawHeader(doc: Doc, input: SectionSummaryInput): void {
  const { header, results } = input;
  const left = contentLeft(doc);
  const width = contentWidth(doc);
  const top = doc.page.margins.top;
  doc.save().rect(left, top, width, 3).fill(COLOR.accent).restore();
  doc.font(FONT.regular).fontSize(SIZE.small).fillColor(COLOR.muted).text('RATEPROOF · KINETICS ANALYSIS', left, top + 10, { lineBreak: false, characterSpacing: 0.8 });
  doc.font(FONT.bold).fontSize(SIZE.title).fillColor(COLOR.ink).text('Section summary', left, top + 22, { lineBreak: false });
  const checked = results.filter((r) => r.status === 'checked').length;
  const facts: Array<[string, string]> = [
    ['Course', header.course],
    ['Section', header.section],
    ['Assignment', header.assignment],
    ['Graded', formatDate(header.gradedAt)],
    ['Submissions', `${results.length} (${checked} checked, ${results.length - checked} not checked)`],
    ['Fit asked for', `ln F against t ${input.settings.fitModel === 'origin' ? 'through the origin' : 'with an intercept'}`],
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

function drawScores(doc: Doc, input: SectionSummaryInput): void {
  const checked = input.results.filter((r) => r.status === 'checked');
  sectionHeading(doc, 'Score distribution', 200);
  if (checked.length === 0) {
    paragraph(doc, 'No submission could be checked.');
    return;
  }
  const fractions = checked.map(scoreFraction);
  const s = spread(fractions.map((f) => f * 100))!;
  paragraph(
    doc,
    `${checked.length} checked submission${checked.length === 1 ? '' : 's'}: mean ${s.mean.toFixed(1)} %, median ${s.median.toFixed(1)} %` +
      (Number.isFinite(s.sd) ? `, SD ${s.sd.toFixed(1)} %` : '') +
      `; lowest ${s.min.toFixed(0)} %, highest ${s.max.toFixed(0)} %.`,
  );
  drawScoreHistogram(doc, percentBins(fractions));
}

function spreadRow(values: ClassValues, source: string, data: number[]): string[] {
  const s = spread(data);
  const outside = values.band ? data.filter((v) => v < values.band!.min || v > values.band!.max).length : undefined;
  return [
    SYMBOL[values.quantity],
    source,
    String(s?.n ?? 0),
    s ? formatNumber(s.mean) : '—',
    s && Number.isFinite(s.sd) ? formatNumber(s.sd, 2) : '—',
    s ? formatNumber(s.median) : '—',
    s ? `${formatNumber(s.min, 3)} to ${formatNumber(s.max, 3)}` : '—',
    values.band ? `${formatNumber(values.band.min, 3)} to ${formatNumber(values.band.max, 3)}` : 'none',
    outside === undefined ? '—' : String(outside),
  ];
}

function drawRateConstants(doc: Doc, input: SectionSummaryInput): void {
  const values = classValues(input.settings, input.results, input.submissions);
  if (values.every((v) => v.refit.length === 0 && v.reported.length === 0)) return;
  sectionHeading(doc, 'The class’s k_{N} and k_{A}', 150);
  paragraph(
    doc,
    `Refit: our fit of each student’s own readings. Reported: the values the students handed in` +
      (input.submissions ? '' : ' (not given for this summary)') +
      `, converted to the assignment’s units. SD is the sample standard deviation. Units: ${prettyUnit(input.settings.units.kN)} for the first-order constant, ${prettyUnit(input.settings.units.kA)} for the catalytic one.`,
    { size: SIZE.small, color: COLOR.muted },
  );
  const rows = values.flatMap((v) => [spreadRow(v, 'refit', v.refit), ...(input.submissions ? [spreadRow(v, 'reported', v.reported)] : [])]);
  drawTable(
    doc,
    [
      { header: '', weight: 0.5 },
      { header: 'Source', weight: 0.9 },
      { header: 'n', weight: 0.4, align: 'right' },
      { header: 'Mean', weight: 1, align: 'right' },
      { header: 'SD', weight: 0.9, align: 'right' },
      { header: 'Median', weight: 1, align: 'right' },
      { header: 'Range', weight: 1.8 },
      { header: 'Reference band', weight: 1.6 },
      { header: 'Outside band', weight: 1.1, align: 'right' },
    ],
    rows,
    { zebra: true, keepRows: rows.length },
  );
  const unreadable = values.reduce((n, v) => n + v.unreadable, 0);
  if (unreadable > 0) paragraph(doc, `${unreadable} reported value(s) left out: their unit could not be read.`, { size: SIZE.small, color: COLOR.muted });
  for (const v of values) {
    if (v.refit.length + v.reported.length === 0) continue;
    ensureSpace(doc, 130);
    moveTo(doc, doc.y + 6);
    drawStripPlot(doc, v);
  }
}

function drawCodes(doc: Doc, input: SectionSummaryInput): void {
  const counts = codeCounts(input.results);
  const checked = input.results.filter((r) => r.status === 'checked').length;
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

function drawAttention(doc: Doc, input: SectionSummaryInput): void {
  const list = needAttention(input.results);
  sectionHeading(doc, 'Students who most need attention', 80);
  if (list.length === 0) {
    paragraph(doc, 'Every student has full points and no error.');
    return;
  }
  paragraph(doc, 'Not checked first, then the lowest share of the points, then the most errors. Codes: error findings, most costly first.', { size: SIZE.small, color: COLOR.muted });
  drawTable(
    doc,
    [
      { header: 'Student id', weight: 1.3 },
      { header: 'Score', weight: 1, align: 'right' },
      { header: 'Errors', weight: 0.7, align: 'right' },
      { header: 'Warnings', weight: 0.8, align: 'right' },
      { header: 'Main codes', weight: 3.4 },
    ],
    list.map(attentionRow),
    { zebra: true, keepRows: 4 },
  );
}

/**
 * A section at a glance, as PDF bytes: score distribution, the class's k_N and k_A against the
 * reference band, how often each finding occurred, who most needs a TA's attention (ids only), and
 * the section's signals for review where they are given.
 */
export async function renderSectionSummary(input: SectionSummaryInput): Promise<Buffer> {
  const gradedAt = new Date(input.header.gradedAt);
  const doc = createDocument({ title: `Section summary ${input.header.section}`, date: Number.isNaN(gradedAt.getTime()) ? new Date(0) : gradedAt });
  const bytes = collect(doc);
  drawHeader(doc, input);
  drawScores(doc, input);
  drawAttention(doc, input);
  drawRateConstants(doc, input);
  drawCodes(doc, input);
  if (input.signals || input.results.some((r) => (r.signals ?? []).length > 0)) drawSignals(doc, input.signals, input.results, input.submissions);
  finish(doc, {
    left: `Rateproof section summary · ${input.header.section} · ${input.header.assignment} · ${formatPoints(input.results.length)} students`,
    invented: input.invented ? INVENTED_NOTE : undefined,
  });
  return bytes;
}
