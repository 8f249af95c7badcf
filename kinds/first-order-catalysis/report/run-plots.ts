import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { legend, marker, type LegendItem } from '../../../reports/pdf/marks.ts';
import { Plot, type Box } from '../../../reports/pdf/plot.ts';
import { drawRich, richWidth } from '../../../reports/pdf/rich-text.ts';
import { nearValues, niceAxis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { OUR_LINE, THEIR_LINE, type Line } from '../../../reports/feedback/plot-lines.ts';
import type { RunSeries } from './run-series.ts';

const PLOT_HEIGHT = 168;
const NOTE_HEIGHT = 26;
const GAP = 14;

/** `Run “0.05 M” · 25 °C`: the temperature where the student recorded one. */
export function runTitle(series: RunSeries): string {
  return series.temperatureC === undefined ? `Run “${series.label}”` : `Run “${series.label}” · ${formatNumber(series.temperatureC, 3)} °C`;
}

const at = (line: Line, t: number) => line.intercept + line.slope * t;

/**
 * The y range: the points and our line always; the student's line only where it stays within a few
 * times the data's span, so that a line off by a factor of 60 does not flatten the data to a stripe.
 */
function yValues(series: RunSeries, tMax: number): number[] {
  const theirs = series.theirLine ? [at(series.theirLine, 0), at(series.theirLine, tMax)] : [];
  return nearValues([...series.points.map((p) => p.y), at(series.ourLine, 0), at(series.ourLine, tMax)], theirs);
}

function drawRunPlot(doc: Doc, series: RunSeries, box: Box): void {
  const tMax = Math.max(...series.points.map((p) => p.t), ...series.ours.map((p) => p.t));
  // No padding on t: the axis ends at the last reading when that is a round number.
  const plot = new Plot(doc, box, niceAxis([0, tMax], { includeZero: true, pad: 0 }), niceAxis(yValues(series, tMax), { pad: 0.03 }), {
    title: runTitle(series),
    x: `t / ${prettyUnit(series.timeUnit)}`,
    y: 'ln F',
  });
  plot.drawFrame();
  plot.line(series.ourLine.intercept, series.ourLine.slope, OUR_LINE);
  if (series.theirLine) plot.line(series.theirLine.intercept, series.theirLine.slope, THEIR_LINE);
  // Markers are not clipped, so that a point on the frame shows whole.
  for (const p of series.points.filter((q) => plot.inside(q.t, q.y))) {
    const suspect = series.suspect.includes(p.index);
    marker(doc, suspect ? 'diamond' : series.studentPoints ? 'disc' : 'ring', plot.sx(p.t), plot.sy(p.y), suspect ? 5.5 : 3.6, suspect ? COLOR.student : COLOR.ink);
  }
  const perRun = `${prettyUnit(series.timeUnit)}⁻¹`;
  // Two short lines under the plot, each within its width: our k, then the student's (or why not drawn).
  const lines = [
    `refit k_{obs} = ${formatNumber(series.ourK)} ${perRun}`,
    series.theirK !== undefined ? `your k_{obs} = ${formatNumber(series.theirK)} ${perRun} (dashed line${series.theirLine && !plot.crosses(series.theirLine.intercept, series.theirLine.slope) ? ', beyond the plot' : ''})` : series.note,
  ].filter((line): line is string => line !== undefined);
  const room = box.x + box.width - plot.area.x;
  lines.forEach((line, i) => {
    const size = richWidth(doc, line, SIZE.tiny) <= room ? SIZE.tiny : SIZE.tiny * (room / richWidth(doc, line, SIZE.tiny));
    drawRich(doc, line, plot.area.x, box.y + box.height + 1 + i * 9, { size, color: COLOR.muted });
  });
}

/** ln F against t for every run, two plots a row. */
export function drawRunPlots(doc: Doc, series: Array<RunSeries | undefined>): void {
  const drawable = series.filter((s): s is RunSeries => s !== undefined && s.points.length > 0);
  const skipped = series.filter((s) => s === undefined).length;
  if (drawable.length === 0) return;
  sectionHeading(doc, 'ln F against t, run by run', PLOT_HEIGHT + 50);
  drawRich(doc, 'F = (x_{t} − x_{∞}) / (x_{0} − x_{∞}), x the reading (α in polarimetry); t counted from the first reading.', contentLeft(doc), doc.y, {
    size: SIZE.small,
    color: COLOR.muted,
  });
  moveTo(doc, doc.y + 13);
  const anyStudent = drawable.some((s) => s.studentPoints);
  const anyOurs = drawable.some((s) => !s.studentPoints);
  const items: LegendItem[] = [
    ...(anyStudent ? [{ kind: 'marker', shape: 'disc', color: COLOR.ink, label: 'your ln F column' } as const] : []),
    ...(anyOurs ? [{ kind: 'marker', shape: 'ring', color: COLOR.ink, label: 'ln F from your readings (no column given)' } as const] : []),
    { kind: 'line', style: OUR_LINE, label: 'refit line' },
    { kind: 'line', style: THEIR_LINE, label: 'line with your k_{obs} (runs with a finding)' },
    ...(drawable.some((s) => s.suspect.length > 0) ? [{ kind: 'marker', shape: 'diamond', color: COLOR.student, label: 'suspect reading' } as const] : []),
  ];
  moveTo(doc, doc.y + legend(doc, items, contentLeft(doc), doc.y, contentWidth(doc)) + 4);
  const width = (contentWidth(doc) - GAP) / 2;
  for (let i = 0; i < drawable.length; i += 2) {
    const top = ensureSpace(doc, PLOT_HEIGHT + NOTE_HEIGHT);
    drawable.slice(i, i + 2).forEach((s, j) => drawRunPlot(doc, s, { x: contentLeft(doc) + j * (width + GAP), y: top, width, height: PLOT_HEIGHT }));
    moveTo(doc, top + PLOT_HEIGHT + NOTE_HEIGHT);
  }
  if (skipped > 0) {
    paragraph(doc, `${skipped} run(s) without a measured end value were refitted by the exponential fit and have no ln F plot.`, { size: SIZE.small, color: COLOR.muted });
  }
}
