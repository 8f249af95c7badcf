import { fill, h } from './dom.js';

/**
 * An editable grid for one CSV file of a kind's layout: a row per line of the file, a text box per
 * column, rows added and removed, and a block pasted from a spreadsheet (tab-separated) or a CSV file
 * (comma-separated, with or without its header line) spread over the cells. The page sends the grid
 * as the CSV file it stands for, so the service reads it exactly as it reads an uploaded file.
 */

/** @typedef {{ name: string, optional: boolean }} GridColumn */

/**
 * Text of a spreadsheet or CSV block as rows of cells: tab-separated when it holds a tab, else
 * comma-separated; a quoted cell may hold the separator, a line break or a doubled quote.
 * @param {string} text
 * @returns {string[][]}
 */
export function parseBlock(text) {
  const separator = text.includes('\t') ? '\t' : ',';
  /** @type {string[][]} */
  const rows = [];
  /** @type {string[]} */
  let row = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') (cell += '"'), i++;
      else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"' && cell === '') quoted = true;
    else if (c === separator) row.push(cell), (cell = '');
    else if (c === '\n' || c === '\r') {
      if (c === '\r' && text[i + 1] === '\n') i++;
      row.push(cell), rows.push(row), (row = []), (cell = '');
    } else cell += c;
  }
  if (cell !== '' || row.length) row.push(cell), rows.push(row);
  return rows.map((r) => r.map((x) => x.trim()));
}

/** A cell as CSV writes it: quoted where it holds a comma, a quote or a line break. @param {string} value */
const csvCell = (value) => (/[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value);

/**
 * @param {{ id: string, caption: string, columns: GridColumn[], startRows: number, ownColumn: string }} spec
 *   `ownColumn`: the column the page fills itself (the student's id), which a pasted header may name
 */
export function valueGrid({ id, caption, columns, startRows, ownColumn }) {
  /** @type {string[][]} */
  let rows = Array.from({ length: startRows }, () => columns.map(() => ''));
  /** Grid rows with a problem the service named, by index, with its message. @type {Map<number, string>} */
  let problems = new Map();
  const body = h('tbody');
  const note = h('p', { class: 'hint', 'aria-live': 'polite' });

  function draw() {
    fill(body, rows.map((cells, r) =>
      h(
        'tr',
        { class: problems.has(r) ? 'invalid' : undefined, title: problems.get(r) },
        h('th', { scope: 'row' }, r + 1),
        cells.map((value, c) =>
          h('td', {}, h('input', { type: 'text', value, 'data-row': r, 'data-col': c, 'aria-label': `${columns[c].name}, row ${r + 1}`, 'aria-invalid': problems.has(r) ? 'true' : undefined, spellcheck: 'false', autocomplete: 'off', oninput: (/** @type {Event} */ e) => (rows[r][c] = /** @type {HTMLInputElement} */ (e.target).value) })),
        ),
        h('td', {}, h('button', { type: 'button', class: 'quiet remove-row', 'aria-label': `Remove row ${r + 1}`, title: 'Remove this row', onclick: () => removeRow(r) }, '×')),
      ),
    ));
  }

  /** @param {number} r */
  function removeRow(r) {
    rows.splice(r, 1);
    if (rows.length === 0) rows.push(columns.map(() => ''));
    problems = new Map();
    draw();
    note.textContent = `Row ${r + 1} removed.`;
  }

  function addRow() {
    rows.push(columns.map(() => ''));
    draw();
    /** @type {HTMLInputElement | null} */ (body.querySelector(`input[data-row="${rows.length - 1}"][data-col="0"]`))?.focus();
  }

  /**
   * A block pasted into the cell at (row, col): spread from there, or by its header line's names
   * when its first line names the columns.
   * @param {ClipboardEvent} event
   */
  function paste(event) {
    const target = /** @type {HTMLElement} */ (event.target);
    const text = event.clipboardData?.getData('text/plain') ?? '';
    // One value without a tab or line break is pasted into its cell as any text is.
    if (!(target instanceof HTMLInputElement) || !/[\t\n]/.test(text.trim())) return;
    event.preventDefault();
    const block = parseBlock(text.trim());
    const names = columns.map((c) => c.name.toLowerCase());
    const head = block[0].map((x) => x.toLowerCase());
    const isHeader = head.some((x) => names.includes(x)) && head.every((x) => x === '' || names.includes(x) || x === ownColumn);
    const row0 = isHeader ? rows.findIndex((cells) => cells.every((x) => x === '')) : Number(target.dataset.row);
    const start = row0 < 0 ? rows.length : row0;
    const col0 = Number(target.dataset.col);
    // Where each pasted cell goes: by name under a header line, else from the cell pasted into on.
    const place = isHeader ? head.map((x) => names.indexOf(x)) : block[0].map((_, i) => (col0 + i < columns.length ? col0 + i : -1));
    const lines = isHeader ? block.slice(1) : block;
    lines.forEach((cells, i) => {
      rows[start + i] ??= columns.map(() => '');
      cells.forEach((value, j) => {
        if (place[j] !== undefined && place[j] >= 0) rows[start + i][place[j]] = value;
      });
    });
    const dropped = block[0].length - place.filter((p) => p >= 0).length;
    problems = new Map();
    draw();
    note.textContent = `${lines.length} row${lines.length === 1 ? '' : 's'} pasted${isHeader ? ' by their column names' : ''}${dropped > 0 ? `; ${dropped} column${dropped === 1 ? '' : 's'} left out (${isHeader ? 'not one of this file’s' : 'past the last one'})` : ''}.`;
  }

  draw();
  const element = h(
    'div',
    { class: 'value-grid-part' },
    h('div', { class: 'table-wrap grid-wrap' }, h('table', { class: 'value-grid', id, onpaste: paste }, h('caption', {}, caption), h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, h('span', { class: 'visually-hidden' }, 'Row')), columns.map((c) => h('th', { scope: 'col' }, c.name, c.optional ? h('span', { class: 'optional' }, ' optional') : null)), h('th', { scope: 'col' }, h('span', { class: 'visually-hidden' }, 'Remove')))), body)),
    h('div', { class: 'row grid-actions' }, h('button', { type: 'button', onclick: addRow }, 'Add a row'), note),
  );

  return {
    element,
    /** Whether any cell holds a value. */
    filled: () => rows.some((cells) => cells.some((x) => x.trim() !== '')),
    /**
     * The grid as its CSV file, with `ownValue` in `ownColumn` on every line: the columns every file
     * has and each optional one that holds a value; empty rows left out. `rowOfLine[n]` is the grid
     * row written on the file's line n (line 1 is the header).
     * @param {string} ownValue
     */
    csv(ownValue) {
      const used = columns.map((c, i) => !c.optional || rows.some((cells) => cells[i].trim() !== ''));
      const kept = rows.map((cells, r) => ({ cells, r })).filter(({ cells }) => cells.some((x) => x.trim() !== ''));
      const line = (/** @type {string} */ own, /** @type {string[]} */ cells) => [own, ...cells.filter((_, i) => used[i])].map(csvCell).join(',');
      return {
        text: [line(ownColumn, columns.map((c) => c.name)), ...kept.map(({ cells }) => line(ownValue, cells.map((x) => x.trim())))].join('\n') + '\n',
        rowOfLine: [-1, -1, ...kept.map(({ r }) => r)],
      };
    },
    /** Marks the rows the service named, by grid row, and clears the others. @param {Map<number, string>} named */
    mark(named) {
      problems = named;
      draw();
    },
  };
}
