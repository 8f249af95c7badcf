import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { contentLeft, contentWidth, moveTo, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { errorBar, legend, marker, type LegendItem } from '../../../reports/pdf/marks.ts';
import { Plot } from '../../../reports/pdf/plot.ts';
import { drawRich } from '../../../reports/pdf/rich-text.ts';
import { nearValues, niceAxis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { OUR_LINE, THEIR_LINE, type Line } from '../../../reports/feedback/plot-lines.ts';
import type { RateLawSeries } from './rate-law-series.ts';

const HEIGHT = 200;

const lineText = (who: string, line: Line | undefined, unit: string) =>
  line ? `${who}: k_{N} = ${formatNumber(line.intercept)} ${prettyUnit(unit)}, k_{A} = ${formatNumber(line.slope)} M⁻¹ ${prettyUnit(unit)}` : '';

/** k_obs against [catalyst]: our points with SE bars, the student's points, both straight lines. */
export function drawRateLawPlot(doc: Doc, series: RateLawSeries): void {
  sectionHeading(doc, 'Rate law: k_{obs} against [catalyst]', HEIGHT + 30);
  const top = doc.y;
  const cMax = Math.max(...series.ours.map((p) => p.c));
  const ys = [
    0,
    ...series.ours.flatMap((p) => [p.k - p.se, p.k + p.se]),
    ...(series.ourLine ? [series.ourLine.intercept, series.ourLine.intercept + series.ourLine.slope * cMax] : []),
  ];
  // The student's values widen the range only while they stay near the data (see the run plots), so a
  // k off by a factor of 60 does not flatten the rest; what lies beyond is said in words.
  const theirYs = [...series.theirs.map((p) => p.k), ...(series.theirLine ? [series.theirLine.intercept, series.theirLine.intercept + series.theirLine.slope * cMax] : [])];
  const plot = new Plot(doc, { x: contentLeft(doc), y: top, width: contentWidth(doc), height: HEIGHT }, niceAxis([0, cMax], { includeZero: true, pad: 0 }), niceAxis(nearValues(ys, theirYs), { pad: 0.05 }), {
    x: '[catalyst] / M',
    y: `k_{obs} / ${prettyUnit(series.kUnit)}`,
  });
  plot.drawFrame();
  // Counted on the finished axes: a value outside the data's range may still fall inside them.
  const offScale = series.theirs.filter((p) => !plot.inside(p.c, p.k)).length;
  if (series.ourLine) plot.line(series.ourLine.intercept, series.ourLine.slope, OUR_LINE);
  if (series.theirLine) plot.line(series.theirLine.intercept, series.theirLine.slope, THEIR_LINE);
  // Markers are not clipped, so that a point on the frame shows whole.
  for (const p of series.ours) {
    errorBar(doc, plot.sx(p.c), plot.sy(p.k - p.se), plot.sy(p.k + p.se), COLOR.accent);
    marker(doc, 'disc', plot.sx(p.c), plot.sy(p.k), 4.5, COLOR.accent);
  }
  for (const p of series.theirs.filter((q) => plot.inside(q.c, q.k))) marker(doc, 'diamond', plot.sx(p.c) + 5, plot.sy(p.k), 4.5, COLOR.student);
  moveTo(doc, top + HEIGHT + 4);
  const items: LegendItem[] = [
    { kind: 'marker', shape: 'disc', color: COLOR.accent, label: 'refit k_{obs} ± SE', bar: true },
    { kind: 'marker', shape: 'diamond', color: COLOR.student, label: 'your k_{obs} (drawn a little to the right)' },
    { kind: 'line', style: OUR_LINE, label: 'refit k_{obs} = k_{N} + k_{A}[catalyst]' },
    ...(series.theirLine ? [{ kind: 'line', style: THEIR_LINE, label: 'your k_{N} and k_{A}' } as const] : []),
  ];
  moveTo(doc, doc.y + legend(doc, items, contentLeft(doc), doc.y, contentWidth(doc)) + 2);
  const texts = [lineText('Refit', series.ourLine, series.kUnit), lineText('Yours', series.theirLine, series.kUnit)].filter((t) => t !== '');
  for (const text of texts) {
    drawRich(doc, text, contentLeft(doc), doc.y, { size: SIZE.small, color: COLOR.ink });
    moveTo(doc, doc.y + 12);
  }
  const notes = [...series.notes, ...(offScale > 0 ? [`${offScale} of your k_{obs} values lie beyond the plotted range (see the table above).`] : [])];
  for (const note of notes) {
    drawRich(doc, note, contentLeft(doc), doc.y, { size: SIZE.small, color: COLOR.muted });
    moveTo(doc, doc.y + 12);
  }
}
