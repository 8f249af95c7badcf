import { api, ApiFailure } from './api.js';
import { fill, h, when } from './dom.js';
import { kindDescription } from './kinds.js';
import { deadlineText, lateMark, latePolicyText } from './student-words.js';
import { valueGrid } from './value-grid.js';

/**
 * @import { Failure } from './api.js'
 * @import { Rejection } from '../../schemas/result.ts'
 * @import { StudentAssignment, StudentMe, StudentSubmitted } from './student-types.js'
 */

/**
 * A field's path in words, counted from 1 as a person counts: `runs[0].readings[2][0]` is
 * `run 1, reading 3, item 1`. The page knows no kind: it reads any path the same way.
 * @param {string} path
 */
export function fieldWords(path) {
  const one = (/** @type {string} */ word) => word.replace(/ies$/, 'y').replace(/s$/, '');
  return path
    .replace(/^body\.?/, '')
    .replace(/([A-Za-z_]+)\[(\d+)\]/g, (_, key, i) => `${one(key)} ${Number(i) + 1}`)
    .replace(/\[(\d+)\]/g, (_, i) => `, item ${Number(i) + 1}`)
    .replace(/\./g, ', ')
    .replace(/ ,/g, ',');
}

/** The column of a kind's CSV layout that names the student; the page fills it with their own id. */
const OWN_COLUMN = 'student_id';

/**
 * Handing in one assignment: a grid per CSV file of the kind's layout (typed, or pasted from a
 * spreadsheet), or the files themselves. The answer is the form check only (what was read), never a
 * grade: the feedback comes when the teaching staff release it.
 * @param {StudentMe} me
 * @param {StudentAssignment} assignment
 * @param {Failure} failure
 */
export async function submitView(me, assignment, failure) {
  const kind = await kindDescription(assignment.kind);
  const files = kind?.upload.csv ?? [];
  const url = `/v1/student/assignments/${assignment.id}/submissions`;
  const outcome = h('div', { class: 'submit-outcome', 'aria-live': 'polite', tabindex: '-1' });
  const grids = files.map((file) => ({
    file,
    grid: valueGrid({
      id: `grid-${file.name}`,
      caption: `${file.name}${file.required ? '' : ' (optional)'}`,
      columns: [...file.columns.filter((c) => c !== OWN_COLUMN).map((name) => ({ name, optional: false })), ...file.optionalColumns.map((name) => ({ name, optional: true }))],
      startRows: file.required ? 4 : 2,
      ownColumn: OWN_COLUMN,
    }),
  }));

  /**
   * Sends the files and shows the form check, or the service's reasons by row and field.
   * @param {FormData} form
   * @param {(path: string) => string} where the words for a problem's place
   * @param {(details: Rejection[]) => void} [marked] after a refusal: marks the rows it named
   */
  async function send(form, where, marked) {
    fill(outcome, h('p', {}, 'Sending…'));
    try {
      const answer = /** @type {StudentSubmitted} */ (await api('POST', url, form));
      fill(outcome,
        h('section', { class: 'panel form-check' },
          h('h2', {}, `Version ${answer.version} handed in`),
          h('p', {}, `${when(answer.submittedAt)}, ${lateMark(answer)}.`),
          h('h3', {}, 'What was read'),
          h('ul', { class: 'form-lines' }, answer.form.lines.map((line) => h('li', {}, line))),
          h('p', { class: 'hint' }, 'This says only what the service read from your files, not whether the numbers are right. Your feedback comes once your teaching staff release it; each new version you hand in replaces this one.'),
        ),
      );
      outcome.focus();
    } catch (error) {
      if (error instanceof ApiFailure && error.status === 400) {
        marked?.(error.details);
        fill(outcome,
          h('div', { class: 'panel refused', role: 'alert' },
            h('p', { class: 'form-error' }, 'Nothing was handed in: the service could not read these values.'),
            h('ul', {}, (error.details.length ? error.details : [{ path: '', message: error.message }]).map((d) => h('li', {}, d.path ? [h('strong', {}, where(d.path)), ': '] : null, d.message))),
          ),
        );
      } else if (error instanceof ApiFailure && error.status === 413) fill(outcome, h('p', { class: 'form-error', role: 'alert' }, 'These files are larger than the service takes.'));
      else failure(error);
    }
  }

  /** The grids as their files; a problem on `readings line 5` is named as row 4 of that grid, and marked there. */
  function sendGrids() {
    const form = new FormData();
    /** @type {Map<string, number[]>} */
    const rowsOf = new Map();
    for (const { file, grid } of grids) {
      if (!grid.filled() && !file.required) continue;
      const { text, rowOfLine } = grid.csv(me.studentId);
      rowsOf.set(file.name, rowOfLine);
      form.append(file.name, new Blob([text], { type: 'text/csv' }), `${file.name}.csv`);
    }
    /** @param {string} path */
    const gridPlace = (path) => {
      const m = /^(.*?)(\w+) line (\d+)(.*)$/.exec(path);
      const row = m ? rowsOf.get(m[2])?.[Number(m[3])] : undefined;
      return m && row !== undefined && row >= 0 ? { file: m[2], row, words: `${m[1]}${m[2]}, row ${row + 1}${m[4]}` } : null;
    };
    return send(form, (path) => gridPlace(path)?.words ?? (fieldWords(path) || 'the files'), (details) => {
      for (const { file, grid } of grids) {
        const named = details.map((d) => ({ at: gridPlace(d.path), message: d.message })).filter((x) => x.at?.file === file.name);
        grid.mark(new Map(named.map((x) => [/** @type {{ row: number }} */ (x.at).row, x.message])));
      }
    });
  }

  const chosen = files.map((file) => /** @type {HTMLInputElement} */ (h('input', { type: 'file', id: `file-${file.name}`, accept: '.csv,text/csv' })));
  function sendFiles() {
    const form = new FormData();
    files.forEach((file, i) => {
      const picked = chosen[i].files?.[0];
      if (picked) form.append(file.name, picked, picked.name);
    });
    return send(form, (path) => fieldWords(path) || 'the files');
  }

  const passed = assignment.dueAt !== null && new Date(assignment.dueAt).getTime() < Date.now();
  return h(
    'div',
    { class: 'student-submit' },
    h('p', { class: 'crumbs' }, h('a', { href: '#/' }, 'Your assignments'), ' / ', assignment.title),
    h('h1', {}, `Hand in: ${assignment.title}`),
    h('p', {}, deadlineText(assignment.dueAt), assignment.dueAt ? `. ${latePolicyText(assignment.late)}` : '.'),
    passed ? h('p', { class: 'caution' }, 'The deadline has passed: what you hand in now is marked late.') : null,
    files.length === 0
      ? h('p', { class: 'form-error' }, 'This assignment’s files are not described by the service; ask your teaching staff how to hand it in.')
      : [
          h('section', { class: 'panel' },
            h('h2', {}, 'Type or paste your values'),
            h('p', { class: 'hint' }, 'One row per line of your table. Paste a block copied from a spreadsheet (or a CSV file’s lines, with or without the header line) into a cell: it fills the cells from there, or by column name when it starts with the header. Your student id is added for you.'),
            grids.map(({ grid }) => grid.element),
            h('button', { type: 'button', class: 'primary', onclick: sendGrids }, 'Hand in these values'),
          ),
          h('details', { class: 'panel' },
            h('summary', {}, 'Or upload your CSV files'),
            h('p', { class: 'hint' }, 'Files with a header line naming the columns above; a student_id column may be left out, or hold your own id.'),
            files.map((file, i) => h('div', { class: 'field' }, h('label', { for: `file-${file.name}` }, `${file.name}.csv`, file.required ? '' : ' (optional)'), chosen[i])),
            h('button', { type: 'button', class: 'primary', onclick: sendFiles }, 'Hand in these files'),
          ),
        ],
    outcome,
  );
}
