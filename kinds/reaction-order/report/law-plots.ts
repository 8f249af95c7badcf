import { prettyUnit } from '../../../reports/format.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { legend, marker, type LegendItem, type MarkerShape } from '../../../reports/pdf/marks.ts';
import { Plot, type Box } from '../../../reports/pdf/plot.ts';
import { drawRich, richWidth } from '../../../reports/pdf/rich-text.ts';
import { niceAxis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { OUR_LINE, THEIR_LINE } from '../../../reports/feedback/plot-lines.ts';
import { lastTime, lawYValues } from './law-axes.ts';
import { LAWS, lawTitle } from './laws.ts';
import { lineTexts, type LawSeries } from './law-series.ts';

const PLOT_HEIGHT = 170;
const NOTE_HEIGHT = 34;
const GAP = 14;

/** Runs told apart by shape (and named in the legend), since colour alone carries no meaning here. */
export const RUN_SHAPES: MarkerShape[] = ['disc', 'ring', 'square', 'triangle'];
const shapeOf = (run: number) => RUN_SHAPES[run % RUN_SHAPES.length];


function drawLawPlot(doc: Doc, series: LawSeries, box: Box): void {
  const plot = new Plot(doc, box, niceAxis([0, lastTime(series)], { includeZero: true, pad: 0 }), niceAxis(lawYValues(series), { pad: 0.04 }), {
    title: lawTitle(series.order),
    x: `t / ${prettyUnit(series.timeUnit)}`,
    y: LAWS[series.order].yLabel,
  });
  plot.drawFrame();
  for (const run of series.runs) if (run.ourLine) plot.line(run.ourLine.intercept, run.ourLine.slope, OUR_LINE);
  for (const run of series.runs) if (run.theirLine) plot.line(run.theirLine.intercept, run.theirLine.slope, THEIR_LINE);
  // Markers are not clipped, so that a point on the frame shows whole.
  series.runs.forEach((run, r) => {
    for (const p of run.points) if (plot.inside(p.t, p.y)) marker(doc, shapeOf(r), plot.sx(p.t), plot.sy(p.y), 3.4, COLOR.ink);
  });
  const beyond = series.runs.some((r) => r.theirLine) && !series.runs.some((r) => r.theirLine && plot.crosses(r.theirLine.intercept, r.theirLine.slope));
  const lines = [...lineTexts(series, 'your', beyond), ...series.notes];
  // Each line within the plot's width, made smaller where it would run on.
  const room = box.x + box.width - plot.area.x;
  lines.forEach((line, i) => {
    const size = Math.min(SIZE.tiny, SIZE.tiny * (room / richWidth(doc, line, SIZE.tiny)));
    drawRich(doc, line, plot.area.x, box.y + box.height + 1 + i * 9, { size, color: COLOR.muted });
  });
}

/** [A], ln [A] and 1/[A] against t, every run on each: the straight one is the order's. */
export function drawLawPlots(doc: Doc, all: LawSeries[]): void {
  if (all.every((s) => s.runs.every((r) => r.points.length === 0))) return;
  sectionHeading(doc, 'The three integrated laws', PLOT_HEIGHT + 60);
  paragraph(doc, 'The order is the one whose plot is straight over the whole run. Each run is drawn with its own intercept and the law’s common k; [A] is our conversion of your readings.', { size: SIZE.small, color: COLOR.muted });
  const runs = all[0].runs;
  const items: LegendItem[] = [
    ...runs.map((run, r) => ({ kind: 'marker', shape: shapeOf(r), color: COLOR.ink, label: `run “${run.label}”` }) as const),
    { kind: 'line', style: OUR_LINE, label: 'refit line' },
    ...(all.some((s) => s.theirK !== undefined) ? [{ kind: 'line', style: THEIR_LINE, label: 'line with your k' } as const] : []),
  ];
  moveTo(doc, doc.y + legend(doc, items, contentLeft(doc), doc.y, contentWidth(doc)) + 4);
  const width = (contentWidth(doc) - GAP) / 2;
  for (let i = 0; i < all.length; i += 2) {
    const top = ensureSpace(doc, PLOT_HEIGHT + NOTE_HEIGHT);
    all.slice(i, i + 2).forEach((s, j) => drawLawPlot(doc, s, { x: contentLeft(doc) + j * (width + GAP), y: top, width, height: PLOT_HEIGHT }));
    moveTo(doc, top + PLOT_HEIGHT + NOTE_HEIGHT);
  }
}
