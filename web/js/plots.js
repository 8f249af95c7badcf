import { num, s } from './dom.js';

/**
 * Plots drawn in the page, as SVG: ln F against t for every run, and k_obs against the catalyst
 * concentration; on each our line (solid) and the student's (dashed). The legend sits below the axes,
 * never over the points.
 */
const W = 520;
const PLOT_H = 300;
const PAD = { left: 64, right: 16, top: 16, bottom: 48 };
const LEGEND_ROW = 18;
const LEGEND_COLUMNS = 3;
const MARKS = ['#1d5c63', '#b5542b', '#5b4a91', '#3f7f3a', '#8a6d1f', '#7a3050'];
const DASH = '6 4';

function ticks(lo, hi) {
  const step = 10 ** Math.floor(Math.log10((hi - lo) / 4 || 1));
  const nice = [1, 2, 5, 10].map((m) => m * step).find((st) => (hi - lo) / st <= 6) ?? step * 10;
  const out = [];
  for (let v = Math.ceil(lo / nice) * nice; v <= hi + nice * 1e-9; v += nice) out.push(Number(v.toPrecision(12)));
  return out;
}

/** legendItems: [{ label, colour, mark: 'dot' | 'line' | 'dash' }], drawn in rows below the x-axis label. */
function frame(title, xLabel, yLabel, xs, ys, legendItems) {
  const finite = (v) => v.filter(Number.isFinite);
  const [x0, x1] = [Math.min(...finite(xs), 0), Math.max(...finite(xs))];
  const [y0, y1] = [Math.min(...finite(ys), 0), Math.max(...finite(ys), 0)];
  const spanX = x1 - x0 || 1;
  const spanY = y1 - y0 || 1;
  const X = (x) => PAD.left + ((x - x0) / spanX) * (W - PAD.left - PAD.right);
  const Y = (y) => PLOT_H - PAD.bottom - ((y - y0) / spanY) * (PLOT_H - PAD.top - PAD.bottom);
  const height = PLOT_H + Math.ceil(legendItems.length / LEGEND_COLUMNS) * LEGEND_ROW + 4;
  const svg = s('svg', { viewBox: `0 0 ${W} ${height}`, role: 'img', 'aria-label': title, class: 'plot' }, s('title', {}, title));
  const axes = s('g', { class: 'axes' });
  axes.append(s('line', { x1: PAD.left, y1: Y(y0), x2: W - PAD.right, y2: Y(y0) }), s('line', { x1: PAD.left, y1: PAD.top, x2: PAD.left, y2: PLOT_H - PAD.bottom }));
  for (const t of ticks(x0, x1)) axes.append(s('line', { x1: X(t), x2: X(t), y1: Y(y0), y2: Y(y0) + 4 }), s('text', { x: X(t), y: Y(y0) + 16, 'text-anchor': 'middle' }, num(t)));
  for (const t of ticks(y0, y1)) axes.append(s('line', { x1: PAD.left - 4, x2: PAD.left, y1: Y(t), y2: Y(t) }), s('text', { x: PAD.left - 6, y: Y(t) + 4, 'text-anchor': 'end' }, num(t)));
  axes.append(s('text', { x: (PAD.left + W - PAD.right) / 2, y: PLOT_H - 8, 'text-anchor': 'middle', class: 'label' }, xLabel));
  axes.append(s('text', { x: 14, y: (PAD.top + PLOT_H - PAD.bottom) / 2, transform: `rotate(-90 14 ${(PAD.top + PLOT_H - PAD.bottom) / 2})`, 'text-anchor': 'middle', class: 'label' }, yLabel));
  svg.append(axes);
  const legend = s('g', { class: 'legend' });
  const column = (W - PAD.left) / LEGEND_COLUMNS;
  legendItems.forEach((item, i) => {
    const x = PAD.left + (i % LEGEND_COLUMNS) * column;
    const y = PLOT_H + 8 + Math.floor(i / LEGEND_COLUMNS) * LEGEND_ROW;
    const key =
      item.mark === 'dot'
        ? s('circle', { cx: x + 9, cy: y, r: 3.5, fill: item.colour })
        : s('line', { x1: x, x2: x + 18, y1: y, y2: y, stroke: item.colour, 'stroke-width': 1.8, 'stroke-dasharray': item.mark === 'dash' ? DASH : undefined });
    legend.append(key, s('text', { x: x + 24, y: y + 4, fill: item.colour }, item.label));
  });
  svg.append(legend);
  // Lines are clipped to the plotting area, as a fitted line may leave it.
  const clip = `clip-${Math.random().toString(36).slice(2)}`;
  svg.append(s('clipPath', { id: clip }, s('rect', { x: PAD.left, y: PAD.top, width: W - PAD.left - PAD.right, height: PLOT_H - PAD.top - PAD.bottom })));
  const line = (l, cls, colour, dashed) =>
    s('line', { class: cls, x1: X(x0), y1: Y(l.intercept + l.slope * x0), x2: X(x1), y2: Y(l.intercept + l.slope * x1), stroke: colour, 'stroke-width': 1.5, 'stroke-dasharray': dashed ? DASH : undefined, 'clip-path': `url(#${clip})` });
  return { svg, X, Y, line, inside: (x, y) => x >= x0 && x <= x1 && y >= y0 && y <= y1 };
}

const KEY = (colour) => [
  { label: 'refit line', colour, mark: 'line' },
  { label: 'student’s line', colour, mark: 'dash' },
];

/** runs: the series of plot-series.js's runPlotSeries, all in one time unit. */
export function lnFPlot(runs, timeUnit) {
  const items = [...runs.map((run, i) => ({ label: run.label, colour: MARKS[i % MARKS.length], mark: 'dot' })), ...(runs.some((r) => r.theirLine) ? KEY('#444') : KEY('#444').slice(0, 1))];
  const { svg, X, Y, line } = frame('ln F against t for each run', `t / ${timeUnit}`, 'ln F', runs.flatMap((r) => r.points.map((p) => p.t)), runs.flatMap((r) => r.points.map((p) => p.y)), items);
  runs.forEach((run, i) => {
    const colour = MARKS[i % MARKS.length];
    const g = s('g', { class: 'run', 'data-run': run.label, fill: colour });
    run.points.forEach((p) => g.append(s('circle', { cx: X(p.t), cy: Y(p.y), r: 3 })));
    if (run.ourLine) g.append(line(run.ourLine, 'refit', colour, false));
    if (run.theirLine) g.append(line(run.theirLine, 'student', colour, true));
    svg.append(g);
  });
  return svg;
}

/** series: plot-series.js's rateLawPlotSeries. */
export function ratePlot(series) {
  const [ourColour, theirColour] = [MARKS[0], MARKS[1]];
  // The student's values widen the axis only while near ours, so that a k off by a factor of 60 does not
  // flatten the rest; the legend counts those beyond, and the table above gives them.
  const ourKs = series.ours.map((p) => p.k);
  const [lo, hi] = [Math.min(...ourKs, 0), Math.max(...ourKs)];
  const near = (k) => k > lo - (hi - lo) && k < hi + (hi - lo);
  const beyond = series.theirs.filter((p) => !near(p.k)).length;
  const items = [
    { label: 'refit k_obs', colour: ourColour, mark: 'dot' },
    { label: 'refit k_N + k_A c', colour: ourColour, mark: 'line' },
    ...(series.theirs.length ? [{ label: beyond ? `student’s k_obs (${beyond} off the plot)` : 'student’s k_obs', colour: theirColour, mark: 'dot' }] : []),
    ...(series.theirLine ? [{ label: 'student’s k_N + k_A c', colour: theirColour, mark: 'dash' }] : []),
  ];
  const { svg, X, Y, line, inside } = frame('k_obs against the catalyst concentration', '[catalyst] / M', `k_obs / ${series.kUnit}`, series.ours.map((p) => p.c), [...ourKs, ...series.theirs.map((p) => p.k).filter(near), series.ourLine?.intercept ?? 0], items);
  const g = s('g', { fill: ourColour });
  series.ours.forEach((p) => g.append(s('circle', { cx: X(p.c), cy: Y(p.k), r: 4 }, s('title', {}, `${p.label}: ${num(p.k)}`))));
  if (series.ourLine) g.append(line(series.ourLine, 'refit', ourColour, false));
  const t = s('g', { class: 'student', fill: theirColour });
  // The student's points a little to the right, so that one on ours stays visible.
  series.theirs.filter((p) => inside(p.c, p.k)).forEach((p) => t.append(s('circle', { cx: X(p.c) + 6, cy: Y(p.k), r: 3.5 }, s('title', {}, `${p.label}, student: ${num(p.k)}`))));
  if (series.theirLine) t.append(line(series.theirLine, 'student', theirColour, true));
  svg.append(g, t);
  return svg;
}
