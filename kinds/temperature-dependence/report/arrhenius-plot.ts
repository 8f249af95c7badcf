import type { Refit, Submission } from '../schemas.ts';
import { formatNumber } from '../../../reports/format.ts';
import { contentLeft, contentWidth, moveTo, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { legend, marker } from '../../../reports/pdf/marks.ts';
import { Plot, type Box } from '../../../reports/pdf/plot.ts';
import { drawRich, richWidth } from '../../../reports/pdf/rich-text.ts';
import { nearValues, niceAxis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { OUR_LINE, THEIR_LINE, type Line } from '../../../reports/feedback/plot-lines.ts';
import { arrheniusSeries, eyringSeries, type ActivationSeries } from './activation-series.ts';

const HEIGHT = 190;
const GAP = 14;
const NOTE_HEIGHT = 30;

const at = (line: Line, x: number) => line.intercept + line.slope * x;

/**
 * One plot of a series against 1000 K / T: the points, our line, the student's line (dashed) and, under
 * it, the two lines' values or why the student's is missing. The student's line widens the y range only
 * while near the data, so that a slip of a factor of 1000 does not flatten the points to a stripe.
 */
function drawActivationPlot(doc: Doc, series: ActivationSeries, box: Box, title: string, yLabel: string, describeLine: (line: Line) => string): void {
  const xs = series.points.map((p) => p.x);
  const [xMin, xMax] = [Math.min(...xs), Math.max(...xs)];
  const theirYs = series.theirLine ? [at(series.theirLine, xMin), at(series.theirLine, xMax)] : [];
  const ys = nearValues([...series.points.map((p) => p.y), at(series.ourLine, xMin), at(series.ourLine, xMax)], theirYs);
  const plot = new Plot(doc, box, niceAxis(xs, { pad: 0.05 }), niceAxis(ys, { pad: 0.08 }), { title, x: '1000 K / T', y: yLabel });
  plot.drawFrame();
  plot.line(series.ourLine.intercept, series.ourLine.slope, OUR_LINE);
  if (series.theirLine) plot.line(series.theirLine.intercept, series.theirLine.slope, THEIR_LINE);
  series.points.forEach((p) => marker(doc, 'disc', plot.sx(p.x), plot.sy(p.y), 4.5, COLOR.accent));
  const theirs = series.theirLine && `yours (dashed${plot.crosses(series.theirLine.intercept, series.theirLine.slope) ? '' : ', beyond the plot'}): ${describeLine(series.theirLine)}`;
  const lines = [`refit: ${describeLine(series.ourLine)}`, theirs ?? series.note].filter((l): l is string => l !== undefined);
  // Each line within the plot's width, made smaller where it would run on.
  const room = box.x + box.width - plot.area.x;
  lines.forEach((line, i) => {
    const size = Math.min(SIZE.tiny, SIZE.tiny * (room / richWidth(doc, line, SIZE.tiny)));
    drawRich(doc, line, plot.area.x, box.y + box.height + 1 + i * 10, { size, color: COLOR.muted });
  });
}

/** The Arrhenius and Eyring plots side by side, each with our line and the student's. */
export function drawArrheniusPlot(doc: Doc, refit: Refit, reported: Submission['reported']): void {
  const arrhenius = arrheniusSeries(refit, reported);
  const eyring = eyringSeries(refit, reported);
  if (!arrhenius && !eyring) return;
  sectionHeading(doc, 'Arrhenius and Eyring plots', HEIGHT + NOTE_HEIGHT + 30);
  const top = doc.y;
  const height = legend(
    doc,
    [
      { kind: 'marker', shape: 'disc', color: COLOR.accent, label: 'your k at each temperature (refitted where given as readings)' },
      { kind: 'line', style: OUR_LINE, label: 'refit line' },
      { kind: 'line', style: THEIR_LINE, label: 'line from your reported values' },
    ],
    contentLeft(doc),
    top,
    contentWidth(doc),
  );
  const plotTop = top + height + 4;
  const width = (contentWidth(doc) - GAP) / 2;
  const box = (i: number): Box => ({ x: contentLeft(doc) + i * (width + GAP), y: plotTop, width, height: HEIGHT });
  if (arrhenius) {
    drawActivationPlot(doc, arrhenius, box(0), 'Arrhenius: ln k against 1/T', 'ln(k / s^{−1})', (line) => `slope ${formatNumber(line.slope)}, ln(A / s^{−1}) = ${formatNumber(line.intercept)}`);
  }
  if (eyring) {
    drawActivationPlot(doc, eyring, box(arrhenius ? 1 : 0), 'Eyring: ln(k/T) against 1/T', 'ln[(k/T) / (s^{−1} K^{−1})]', (line) => `slope ${formatNumber(line.slope)}, intercept ${formatNumber(line.intercept)}`);
  }
  moveTo(doc, plotTop + HEIGHT + NOTE_HEIGHT);
}
