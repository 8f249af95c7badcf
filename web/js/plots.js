import { plain, s } from './dom.js';

/**
 * A plot the server describes (GET /v1/submissions/{id}/display), drawn as SVG: its axes with the ticks
 * it is sent, each series' points and straight lines (the refit's solid, the student's dashed), and the
 * key below the axes, never over the points. Any kind's plots: the page knows none of them.
 *
 * @import { DisplayPlot } from '../../schemas/display.ts'
 * @typedef {DisplayPlot['legend'][number]} LegendItem
 */
const W = 520;
const PLOT_H = 290;
const PAD = { left: 68, right: 16, top: 16, bottom: 50 };
const LEGEND_ROW = 20;
const COLOURS = ['#1d5c63', '#b5542b', '#5b4a91', '#3f7f3a', '#8a6d1f', '#7a3050'];
const INK = '#444';
const DASH = '6 4';
/** Roughly the width of a character of the key's 13 px text, to lay the key out in rows. */
const CHAR_WIDTH = 7;

/** @param {number | undefined} group */
const colourOf = (group) => (group === undefined ? INK : COLOURS[group % COLOURS.length]);

/**
 * Text with the sheets' `_{sub}` and `^{sup}` markup as SVG tspans (SVG has no sub or sup element).
 * @param {string} text
 * @returns {Array<string | SVGElement>}
 */
function svgMarked(text) {
  return text
    .split(/([_^]\{[^}]*\})/)
    .filter((part) => part !== '')
    .map((part) => {
      const m = /^([_^])\{([^}]*)\}$/.exec(part);
      // A tspan after a shifted one starts back on the baseline.
      return m ? s('tspan', { 'baseline-shift': m[1] === '_' ? 'sub' : 'super', 'font-size': '75%' }, m[2]) : s('tspan', { 'baseline-shift': 'baseline' }, part);
    });
}

/** A hollow diamond centred at (x, y), so that a disc under it stays visible. @param {number} x @param {number} y @param {string} colour */
const diamond = (x, y, colour) => s('path', { class: 'point', transform: `translate(${x} ${y})`, d: 'M 0 -5 L 5 0 L 0 5 L -5 0 Z', fill: 'none', stroke: colour, 'stroke-width': 1.6 });

/**
 * The key in rows below the axes, each entry as wide as its label.
 * @param {LegendItem[]} items
 */
function legend(items) {
  const g = s('g', { class: 'legend' });
  let [x, row] = [PAD.left, 0];
  for (const item of items) {
    const width = 28 + plain(item.label).length * CHAR_WIDTH + 14;
    if (x + width > W && x > PAD.left) [x, row] = [PAD.left, row + 1];
    const y = PLOT_H + 8 + row * LEGEND_ROW;
    const colour = colourOf(item.group);
    const key =
      item.mark === 'disc'
        ? s('circle', { cx: x + 9, cy: y, r: 3.5, fill: colour })
        : item.mark === 'diamond'
          ? diamond(x + 9, y, colour)
          : s('line', { x1: x, x2: x + 18, y1: y, y2: y, stroke: colour, 'stroke-width': 1.8, 'stroke-dasharray': item.mark === 'dash' ? DASH : undefined });
    g.append(key, s('text', { x: x + 24, y: y + 4, fill: colour }, ...svgMarked(item.label)));
    x += width;
  }
  return { g, rows: row + 1 };
}

/**
 * @param {DisplayPlot} plot
 * @returns {SVGSVGElement}
 */
export function drawPlot(plot) {
  const X = (/** @type {number} */ x) => PAD.left + ((x - plot.x.min) / (plot.x.max - plot.x.min || 1)) * (W - PAD.left - PAD.right);
  const Y = (/** @type {number} */ y) => PLOT_H - PAD.bottom - ((y - plot.y.min) / (plot.y.max - plot.y.min || 1)) * (PLOT_H - PAD.top - PAD.bottom);
  const key = legend(plot.legend);
  const height = PLOT_H + key.rows * LEGEND_ROW + 4;
  const svg = /** @type {SVGSVGElement} */ (s('svg', { viewBox: `0 0 ${W} ${height}`, role: 'img', 'aria-label': plain(plot.title), class: 'plot' }, s('title', {}, plain(plot.title))));
  const axes = s('g', { class: 'axes' });
  const [bottom, left] = [Y(plot.y.min), X(plot.x.min)];
  axes.append(s('line', { x1: left, y1: bottom, x2: X(plot.x.max), y2: bottom }), s('line', { x1: left, y1: Y(plot.y.max), x2: left, y2: bottom }));
  for (const t of plot.x.ticks) axes.append(s('line', { x1: X(t.at), x2: X(t.at), y1: bottom, y2: bottom + 4 }), s('text', { x: X(t.at), y: bottom + 16, 'text-anchor': 'middle' }, t.label));
  for (const t of plot.y.ticks) axes.append(s('line', { x1: left - 4, x2: left, y1: Y(t.at), y2: Y(t.at) }), s('text', { x: left - 6, y: Y(t.at) + 4, 'text-anchor': 'end' }, t.label));
  const middleY = (PAD.top + PLOT_H - PAD.bottom) / 2;
  axes.append(
    s('text', { x: (PAD.left + W - PAD.right) / 2, y: PLOT_H - 10, 'text-anchor': 'middle', class: 'label' }, ...svgMarked(plot.x.label)),
    s('text', { x: 14, y: middleY, transform: `rotate(-90 14 ${middleY})`, 'text-anchor': 'middle', class: 'label' }, ...svgMarked(plot.y.label)),
  );
  svg.append(axes, key.g);
  // Lines are clipped to the axes, as a fitted line may leave them; points outside are left out (the notes count them).
  const clip = `clip-${Math.random().toString(36).slice(2)}`;
  svg.append(s('clipPath', { id: clip }, s('rect', { x: left, y: Y(plot.y.max), width: X(plot.x.max) - left, height: bottom - Y(plot.y.max) })));
  const inside = (/** @type {[number, number]} */ [x, y]) => x >= plot.x.min && x <= plot.x.max && y >= plot.y.min && y <= plot.y.max;
  // One element per group (a run, or the refit and the student), holding its points and lines.
  const groups = plot.groups.map((name, i) => s('g', { class: 'group', 'data-group': name, 'data-index': i }));
  for (const series of plot.series) {
    const colour = colourOf(series.group);
    const g = groups[series.group] ?? svg;
    for (const p of (series.points ?? []).filter(inside)) {
      g.append(series.owner === 'student' ? diamond(X(p[0]), Y(p[1]), colour) : s('circle', { class: 'point', cx: X(p[0]), cy: Y(p[1]), r: 3.2, fill: colour }));
    }
    const l = series.line;
    if (l) {
      g.append(
        s('line', {
          class: series.owner === 'student' ? 'student-line' : 'refit-line',
          'data-owner': series.owner,
          x1: X(plot.x.min),
          y1: Y(l.intercept + l.slope * plot.x.min),
          x2: X(plot.x.max),
          y2: Y(l.intercept + l.slope * plot.x.max),
          stroke: colour,
          'stroke-width': 1.6,
          'stroke-dasharray': series.owner === 'student' ? DASH : undefined,
          'clip-path': `url(#${clip})`,
        }),
      );
    }
  }
  svg.append(...groups);
  return svg;
}
