import { num, s } from './dom.js';

/**
 * Plots drawn in the page from the refit, as SVG: ln F against t for every run, and k_obs against the
 * catalyst concentration with the fitted line k_N + k_A [catalyst].
 */
const W = 520;
const H = 300;
const PAD = { left: 64, right: 16, top: 16, bottom: 48 };
const MARKS = ['#1d5c63', '#b5542b', '#5b4a91', '#3f7f3a', '#8a6d1f', '#7a3050'];

function ticks(lo, hi) {
  const step = 10 ** Math.floor(Math.log10((hi - lo) / 4 || 1));
  const nice = [1, 2, 5, 10].map((m) => m * step).find((st) => (hi - lo) / st <= 6) ?? step * 10;
  const out = [];
  for (let v = Math.ceil(lo / nice) * nice; v <= hi + nice * 1e-9; v += nice) out.push(Number(v.toPrecision(12)));
  return out;
}

function frame(title, xLabel, yLabel, xs, ys) {
  const finite = (v) => v.filter(Number.isFinite);
  const [x0, x1] = [Math.min(...finite(xs), 0), Math.max(...finite(xs))];
  const [y0, y1] = [Math.min(...finite(ys), 0), Math.max(...finite(ys), 0)];
  const spanX = x1 - x0 || 1;
  const spanY = y1 - y0 || 1;
  const X = (x) => PAD.left + ((x - x0) / spanX) * (W - PAD.left - PAD.right);
  const Y = (y) => H - PAD.bottom - ((y - y0) / spanY) * (H - PAD.top - PAD.bottom);
  const svg = s('svg', { viewBox: `0 0 ${W} ${H}`, role: 'img', 'aria-label': title, class: 'plot' }, s('title', {}, title));
  const axes = s('g', { class: 'axes' });
  axes.append(s('line', { x1: PAD.left, y1: Y(y0), x2: W - PAD.right, y2: Y(y0) }), s('line', { x1: PAD.left, y1: PAD.top, x2: PAD.left, y2: H - PAD.bottom }));
  for (const t of ticks(x0, x1)) axes.append(s('line', { x1: X(t), x2: X(t), y1: Y(y0), y2: Y(y0) + 4 }), s('text', { x: X(t), y: Y(y0) + 16, 'text-anchor': 'middle' }, num(t)));
  for (const t of ticks(y0, y1)) axes.append(s('line', { x1: PAD.left - 4, x2: PAD.left, y1: Y(t), y2: Y(t) }), s('text', { x: PAD.left - 6, y: Y(t) + 4, 'text-anchor': 'end' }, num(t)));
  axes.append(s('text', { x: (PAD.left + W - PAD.right) / 2, y: H - 8, 'text-anchor': 'middle', class: 'label' }, xLabel));
  axes.append(s('text', { x: 14, y: (PAD.top + H - PAD.bottom) / 2, transform: `rotate(-90 14 ${(PAD.top + H - PAD.bottom) / 2})`, 'text-anchor': 'middle', class: 'label' }, yLabel));
  svg.append(axes);
  // Lines are clipped to the plotting area, as a fitted line may leave it.
  const clip = `clip-${Math.random().toString(36).slice(2)}`;
  svg.append(s('clipPath', { id: clip }, s('rect', { x: PAD.left, y: PAD.top, width: W - PAD.left - PAD.right, height: H - PAD.top - PAD.bottom })));
  return { svg, X, Y, x0, x1, clip };
}

/** runs: [{ label, t: number[], lnF: (number|null)[], k: number, intercept: number }] in the run's time unit. */
export function lnFPlot(runs, timeUnit) {
  const { svg, X, Y, x1, clip } = frame('ln F against t for each run', `t / ${timeUnit}`, 'ln F', runs.flatMap((r) => r.t), runs.flatMap((r) => r.lnF.map((v) => v ?? NaN)));
  const legend = s('g', { class: 'legend' });
  runs.forEach((run, i) => {
    const colour = MARKS[i % MARKS.length];
    const g = s('g', { fill: colour, stroke: colour });
    run.t.forEach((t, j) => Number.isFinite(run.lnF[j]) && run.lnF[j] !== null && g.append(s('circle', { cx: X(t), cy: Y(run.lnF[j]), r: 3 })));
    if (Number.isFinite(run.k)) g.append(s('line', { x1: X(0), y1: Y(run.intercept), x2: X(x1), y2: Y(run.intercept - run.k * x1), 'clip-path': `url(#${clip})`, 'stroke-width': 1.5 }));
    svg.append(g);
    legend.append(s('text', { x: W - PAD.right - 4, y: PAD.top + 14 + 16 * i, 'text-anchor': 'end', fill: colour }, `● ${run.label}`));
  });
  svg.append(legend);
  return svg;
}

/** points: [{ label, c (M), k }] with k in the instructor's unit; the line k_N + k_A c. */
export function ratePlot(points, kN, kA, kUnit) {
  const ks = points.map((p) => p.k);
  const xs = points.map((p) => p.c);
  const { svg, X, Y, x1, clip } = frame('k_obs against the catalyst concentration', '[catalyst] / M', `k_obs / ${kUnit}`, xs, [...ks, kN]);
  const g = s('g', { fill: MARKS[0], stroke: MARKS[0] });
  points.forEach((p) => g.append(s('circle', { cx: X(p.c), cy: Y(p.k), r: 4 }, s('title', {}, `${p.label}: ${num(p.k)}`))));
  if (Number.isFinite(kN) && Number.isFinite(kA)) g.append(s('line', { x1: X(0), y1: Y(kN), x2: X(x1), y2: Y(kN + kA * x1), 'clip-path': `url(#${clip})`, 'stroke-width': 1.5 }));
  svg.append(g);
  return svg;
}
