import { h, marked, num } from './dom.js';
import { drawPlot } from './plots.js';

/**
 * The parts of a result as the server describes it for display (schemas/display.ts), drawn the same
 * for a TA reviewing it and for the student reading it once released. A TA's view adds its own
 * controls to each place through `extra`; the student's adds none.
 *
 * @import { DisplayPlace, DisplayPlot, DisplayStage, DisplayTable, SubmissionDisplay } from '../../schemas/display.ts'
 * @import { Child } from './dom.js'
 * @typedef {DisplayStage['cards'][number]} Card
 * @typedef {(place: DisplayPlace, alone: boolean) => Child[]} PlaceExtra what a view adds under a place (`alone`: the card has this place only)
 */

/** `−1 point`, `no points lost`, as the sheet writes a card's cost. @param {number} points */
export const pointsText = (points) => (points > 0 ? `−${num(points)} ${points === 1 ? 'point' : 'points'}` : 'no points lost');

/**
 * A cell as the server formatted it: markup as sub/sup, one line per line of the cell; a number cell
 * never wraps inside a number.
 * @param {string} text
 */
const cellLines = (text) => text.split('\n').map((line) => h('span', { class: 'line' }, ...marked(line)));

/** The sheet's table of reported against refitted values. @param {DisplayTable} table */
export function comparisonTable(table) {
  return [
    h('p', { class: 'hint' }, ...marked(table.note)),
    h(
      'div',
      { class: 'table-wrap' },
      h(
        'table',
        { class: 'comparison' },
        h('caption', {}, table.caption),
        h('thead', {}, h('tr', {}, table.columns.map((c) => h('th', { scope: 'col', class: c.numeric ? 'number' : undefined }, c.header)))),
        h('tbody', {}, table.rows.map(([first, ...cells]) => h('tr', {}, h('th', { scope: 'row' }, ...cellLines(first)), cells.map((c, i) => h('td', { class: table.columns[i + 1]?.numeric ? 'number' : undefined }, ...cellLines(c)))))),
      ),
    ),
  ];
}

/**
 * Each plot with the notes under it (the lines' values, or why one is missing).
 * @param {DisplayPlot[]} plots
 * @param {string} key how the lines read, in the words of the one looking
 */
export function plotFigures(plots, key) {
  return plots.length
    ? h(
        'div',
        { class: 'plots' },
        plots.map((plot) => h('figure', { class: 'plot-figure' }, drawPlot(plot), plot.notes.length ? h('figcaption', {}, h('ul', { class: 'hint' }, plot.notes.map((n) => h('li', {}, ...marked(n))))) : null)),
        h('p', { class: 'hint' }, key),
      )
    : null;
}

/**
 * One likely cause, as the sheet shows it, with every place it shows.
 * @param {Card} card
 * @param {PlaceExtra} extra
 */
export function findingCard(card, extra) {
  const [first, ...others] = card.places;
  return h(
    'li',
    { class: `finding ${card.severity}` },
    h('p', { class: 'finding-head' }, h('span', { class: `badge ${card.severity}` }, card.severity), ' ', h('span', {}, ...marked(card.where)), ' · ', h('code', {}, card.codes), ' · ', h('span', { class: 'cost' }, pointsText(card.pointsLost))),
    card.detail ? h('p', { class: 'hint detail' }, ...marked(card.detail)) : null,
    h('p', {}, ...marked(card.message)),
    others.length
      ? [
          h('p', {}, others.every((p) => p.pointsLost === 0) ? 'The same likely cause also shows here, counted once (no further points lost):' : 'The same likely cause also shows here:'),
          h('ul', { class: 'places' }, others.map((p) => h('li', {}, ...marked(p.place), p.values ? h('span', { class: 'values' }, ': ', ...marked(p.values)) : null, p.pointsLost > 0 ? ` (${pointsText(p.pointsLost)})` : null))),
        ]
      : null,
    card.places.map((p) => extra(p, card.places.length === 1 && p === first)),
  );
}

/**
 * The findings stage by stage, and the values that only follow from the student's own numbers.
 * @param {SubmissionDisplay} display
 * @param {PlaceExtra} extra
 */
export function stageSections(display, extra) {
  return display.stages.map((stage) =>
    h(
      'section',
      { class: 'stage' },
      h('h2', {}, ...marked(stage.title)),
      stage.cards.length ? h('ul', { class: 'findings' }, stage.cards.map((card) => findingCard(card, extra))) : null,
      stage.followsFromOwn ? h('div', { class: 'follows' }, h('p', { class: 'hint' }, ...marked(stage.followsFromOwn.text)), stage.followsFromOwn.places.map((p) => extra(p, false))) : null,
    ),
  );
}

/** Why a refused submission could not be checked, each place in words; `path` shown folded. @param {SubmissionDisplay['rejected']} rejected */
export function rejectedList(rejected) {
  return rejected.length ? h('ul', { class: 'rejected' }, rejected.map((r) => h('li', {}, h('strong', {}, ...marked(r.place)), ': ', ...marked(r.message), h('details', {}, h('summary', {}, 'Path'), h('code', {}, r.path))))) : null;
}
