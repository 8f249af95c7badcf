import { ApiFailure, upload } from './api.js';
import { fill, h } from './dom.js';

/**
 * @import { Failure } from './api.js'
 * @import { Rejection } from '../../schemas/result.ts'
 * @import { BatchChecked, BatchRejection, BatchStored } from '../../schemas/api/submissions.ts'
 * @import { KindDescription } from '../../schemas/api/kinds.ts'
 */

/**
 * The CSV file a chosen file is: the one whose name its name holds (`points-week3.csv` is `points`),
 * the longest such name first; else the required file.
 * @param {NonNullable<KindDescription['upload']['csv']>} csv
 * @param {File} file
 */
function csvFileOf(csv, file) {
  const name = file.name.toLowerCase();
  const named = [...csv].sort((a, b) => b.name.length - a.name.length).find((c) => name.includes(c.name.toLowerCase()));
  return named ?? csv.find((c) => c.required) ?? csv[0];
}

/**
 * Adding submissions: choose or drop a JSON batch, or the kind's CSV files; the batch is checked first
 * (nothing stored) and its problems listed by place, field and reason; then stored. The files a kind
 * takes come from its description.
 * @param {string} base the URL of the section's assignment
 * @param {KindDescription['upload']} accepted
 * @param {() => Promise<unknown>} refresh
 * @param {Failure} failure
 */
export function uploadPanel(base, accepted, refresh, failure) {
  const csv = accepted.csv ?? [];
  const taken = csv.length ? /\.(json|csv)$/i : /\.json$/i;
  const wanted = csv.length ? `Choose a .json batch, or ${csv.map((c) => `${c.required ? 'the' : 'a'} ${c.name} .csv`).join(' and ')}.` : 'Choose a .json batch.';
  /** @type {File[]} */
  let files = [];
  const chosen = h('p', { class: 'hint', id: 'upload-chosen' }, 'No files chosen.');
  const progress = h('progress', { max: '1', value: '0', hidden: true, 'aria-label': 'Upload progress' });
  const outcome = h('div', { class: 'upload-outcome', 'aria-live': 'polite' });
  /** @type {HTMLInputElement} */
  const input = h('input', { id: 'upload-files', type: 'file', multiple: true, accept: csv.length ? '.json,.csv,application/json,text/csv' : '.json,application/json', onchange: () => choose([...(input.files ?? [])]) });
  const check = h('button', { type: 'button', class: 'primary', disabled: true, onclick: () => send(true) }, 'Check files');

  /** @param {File[]} list */
  function choose(list) {
    files = list.filter((f) => taken.test(f.name));
    chosen.textContent = files.length ? `Chosen: ${files.map((f) => f.name).join(', ')}` : wanted;
    check.disabled = files.length === 0;
    fill(outcome);
  }

  /**
   * The request body: a JSON batch as it is, CSV files as the multipart upload the API reads, each
   * under the name of the kind's file it is.
   * @returns {Promise<{ data: string | FormData, type: string | undefined }>}
   */
  async function body() {
    const json = files.find((f) => /\.json$/i.test(f.name));
    if (json) return { data: await json.text(), type: 'application/json' };
    const form = new FormData();
    for (const file of files) form.append(csvFileOf(csv, file).name, file, file.name);
    return { data: form, type: undefined };
  }

  /** @param {boolean} dryRun */
  async function send(dryRun) {
    progress.hidden = false;
    progress.value = 0;
    fill(outcome, h('p', {}, dryRun ? 'Checking…' : 'Storing…'));
    try {
      const { data, type } = await body();
      const answer = await upload(`${base}/submissions${dryRun ? '?dryRun=true' : ''}`, data, type, (f) => (progress.value = f));
      progress.hidden = true;
      if (dryRun) showCheck(/** @type {BatchChecked} */ (answer));
      else {
        const { stored, rejected } = /** @type {BatchStored} */ (answer);
        fill(outcome, h('p', { role: 'status' }, `Stored ${stored.length} submission${stored.length === 1 ? '' : 's'}; ${rejected.length} problem${rejected.length === 1 ? '' : 's'} left out.`));
        await refresh();
      }
    } catch (error) {
      progress.hidden = true;
      if (error instanceof ApiFailure && error.status < 500 && error.status !== 401) {
        fill(outcome, h('p', { class: 'form-error', role: 'alert' }, error.message), problems(error.details.map(detailRow)));
      } else failure(error);
    }
  }

  /** @param {BatchChecked} answer */
  function showCheck(answer) {
    const store = h('button', { type: 'button', class: 'primary', onclick: () => send(false) }, `Store ${answer.valid} submission${answer.valid === 1 ? '' : 's'}`);
    fill(outcome,
      h('p', { role: 'status' }, `${answer.valid} submission${answer.valid === 1 ? '' : 's'} can be stored; ${answer.rejected.length} problem${answer.rejected.length === 1 ? '' : 's'} found. Nothing is stored yet.`),
      answer.rejected.length ? problems(answer.rejected) : null,
      answer.valid > 0 ? store : null,
    );
  }

  /** @type {HTMLDivElement} */
  const zone = h(
    'div',
    {
      class: 'drop-zone',
      ondragover: (e) => (e.preventDefault(), zone.classList.add('over')),
      ondragleave: () => zone.classList.remove('over'),
      ondrop: (/** @type {DragEvent} */ e) => {
        e.preventDefault();
        zone.classList.remove('over');
        choose([...(e.dataTransfer?.files ?? [])]);
      },
    },
    h('label', { for: 'upload-files' }, 'Choose files, or drop them here'),
    input,
    chosen,
    csv.length ? h('ul', { class: 'hint csv-columns' }, csv.map((c) => h('li', {}, h('strong', {}, `${c.name}.csv`), c.required ? '' : ' (optional)', ': ', h('code', {}, c.columns.join(', ')), c.optionalColumns.length ? [', and where needed ', h('code', {}, c.optionalColumns.join(', '))] : ''))) : null,
  );
  return h('details', { class: 'panel upload' }, h('summary', {}, 'Add submissions'), zone, h('div', { class: 'row' }, check, progress), outcome);
}

/**
 * A refused batch names each problem `submission 2, line 14: runs[0].timeUnit`: the place, then the field.
 * @param {Rejection} d
 * @returns {BatchRejection}
 */
function detailRow(d) {
  const place = /^(submission \d+[^:]*): (.*)$/.exec(d.path);
  return { at: place ? place[1] : '', studentId: null, path: place ? place[2] : d.path, message: d.message };
}

/** @param {BatchRejection[]} list */
function problems(list) {
  return h(
    'table',
    { class: 'problems' },
    h('caption', {}, 'Problems, by place in the files'),
    h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, 'Where'), h('th', { scope: 'col' }, 'Student'), h('th', { scope: 'col' }, 'Field'), h('th', { scope: 'col' }, 'Reason'))),
    h('tbody', {}, list.map((p) => h('tr', {}, h('td', {}, p.at), h('td', {}, p.studentId ?? ''), h('td', {}, h('code', {}, p.path)), h('td', {}, p.message)))),
  );
}
