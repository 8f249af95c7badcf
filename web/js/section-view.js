import { api } from './api.js';
import { fill, h, marked, num, shortWhen } from './dom.js';
import { askToConfirm } from './confirm.js';
import { accessCodesPanel } from './access-codes.js';
import { deadlinePanel } from './deadline-panel.js';
import { kindDescription } from './kinds.js';
import { sectionDownload } from './section-download.js';
import { uploadPanel } from './upload-panel.js';

/**
 * @import { Failure } from './api.js'
 * @import { Props, Children } from './dom.js'
 * @import { Place } from './place.js'
 * @import { Released, ResultRow as ResultRowOfService } from '../../schemas/api/results.ts'
 * @import { AsJson } from '../../schemas/api/as-json.ts'
 * @import { RunMatch, SectionSignals } from '../../schemas/api/signals.ts'
 * @import { KindDescription } from '../../schemas/api/kinds.ts'
 */
/** A results row as the page reads it, its times as ISO strings. @typedef {AsJson<ResultRowOfService>} ResultRow */
/** @typedef {'studentId' | 'version' | 'submittedAt' | 'late' | 'status' | 'score' | 'errors' | 'warnings' | 'codes' | 'released' | 'feedbackFirstReadAt' | 'gradeSent'} Column */

/** @type {Record<string, [label: string, keep: (row: ResultRow) => boolean]>} */
const STATUS_FILTERS = {
  all: ['Every student', () => true],
  errors: ['With errors', (r) => r.errors > 0],
  checked: ['Checked', (r) => r.status === 'checked'],
  rejected: ['Refused by the checker', (r) => r.status === 'rejected'],
  'not-submitted': ['Not submitted', (r) => r.status === 'not-submitted'],
  withdrawn: ['Withdrawn', (r) => r.enrolment === 'withdrawn'],
  unreleased: ['Not yet released', (r) => r.submissionId !== null && !r.released],
  changed: ['Changed since release', (r) => r.changedSinceRelease],
  late: ['Handed in late', (r) => r.late],
  held: ['Late, waiting to be accepted', (r) => r.held],
  unread: ['Released, feedback not read', (r) => r.released && r.feedbackFirstReadAt === null],
  'not-sent': ['Grade not sent to the course', (r) => r.gradeSent?.state === 'failed'],
};

/**
 * A release covers the results not yet released and those changed since (a regrade, an override),
 * save late work held until a TA accepts it.
 * @param {ResultRow} r
 */
const releaseDue = (r) => !r.held && (STATUS_FILTERS.unreleased[1](r) || r.changedSinceRelease);
/**
 * @param {number} n
 * @param {string} word
 */
const plural = (n, word) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** @type {[Column, string][]} */
const COLUMNS = [
  ['studentId', 'Student'],
  ['version', 'Version'],
  ['submittedAt', 'Submitted'],
  ['late', 'Late'],
  ['status', 'Status'],
  ['score', 'Score'],
  ['errors', 'Errors'],
  ['warnings', 'Warnings'],
  ['codes', 'Findings'],
  ['released', 'Released'],
  ['feedbackFirstReadAt', 'Read'],
  ['gradeSent', 'Grade sent'],
];

/** Where a grade send stands, in words; how the column ranks it (trouble first when descending). */
const SEND_WORDS = { sent: 'sent', waiting: 'waiting', failed: 'not sent' };
const SEND_RANK = { sent: 0, waiting: 1, failed: 2 };

const COLUMN_LABELS = Object.fromEntries(COLUMNS);

/**
 * A cell that carries its column's name, which the narrow layout shows beside the value.
 * @param {Column} key
 * @param {Props} props
 * @param {...Children} children
 */
const cell = (key, props, ...children) => h('td', { ...props, 'data-label': COLUMN_LABELS[key] }, ...children);

/** @type {Record<string, string>} */
const STATUS_WORDS = { checked: 'checked', rejected: 'refused', 'not-submitted': 'not submitted', withdrawn: 'withdrawn' };

/** @type {Record<RunMatch['relation'], string>} */
const RELATION_WORDS = { identical: 'the same readings', offset: 'the same readings shifted by a constant', scaled: 'the same readings rescaled', edited: 'the same readings with a few cells changed' };

/**
 * The words of a kind the service no longer describes: the signals still read, in general terms.
 * @type {KindDescription['signals']}
 */
const GENERAL_WORDS = { unit: 'part', reportedValue: 'reported value', codes: [] };

/**
 * Signals across the section, shown only when there are some, worded as prompts for review in the
 * kind's words (what a compared unit is called, which value is compared digit by digit).
 * @param {SectionSignals} signals
 * @param {KindDescription['signals']} words
 */
function signalsPanel(signals, words) {
  if (signals.pairs.length === 0 && signals.smooth.length === 0) return null;
  const alike = signals.pairs.length
    ? [
        h('h3', {}, 'Readings that look alike'),
        h('p', {}, 'Separate measurements agree in shape but not reading by reading. These submissions match cell by cell.'),
        h(
          'ul',
          {},
          signals.pairs.map((p) =>
            h(
              'li',
              {},
              `${p.students[0]} and ${p.students[1]}: `,
              p.runs.length ? `${plural(p.runs.length, words.unit)} with ${[...new Set(p.runs.map((r) => RELATION_WORDS[r.relation]))].join(', ')}` : '',
              p.runs.length && p.sameReportedK.length ? '; ' : '',
              p.sameReportedK.length ? [`${p.sameReportedK.length} `, marked(words.reportedValue), ' written alike to every digit'] : '',
              '.',
            ),
          ),
        ),
        signals.groups.length ? h('p', {}, `Shared by more than two: ${signals.groups.map((g) => g.join(', ')).join('; ')}.`) : null,
      ]
    : [];
  const smooth = signals.smooth.length
    ? [
        h('h3', {}, 'Readings smoother than the instrument reads'),
        h(
          'ul',
          {},
          signals.smooth.map((r) =>
            h('li', {}, `${r.studentId}, ${words.unit} ${r.label}: the readings scatter ${num(r.residualSD)} about the curve, no more than rounding to ${num(r.step)} alone gives; the section's runs scatter ${num(r.sectionMedianSD)} (median).`),
          ),
        ),
      ]
    : [];
  return h(
    'section',
    { class: 'panel signals' },
    h('h2', {}, 'For review: patterns across the section'),
    h('p', { class: 'hint' }, 'Prompts to look and ask the students, not findings: no points depend on them and nothing of them reaches a student.'),
    alike,
    smooth,
  );
}

/**
 * One section's results for one assignment: every roster student, filters, counts, release, files.
 * @param {Place} place
 * @param {Failure} failure
 * @param {boolean} instructor whether the caller sets the deadline and issues access codes
 */
export async function sectionView(place, failure, instructor) {
  const base = `/v1/sections/${place.section.id}/assignments/${place.assignment.id}`;
  const kind = await kindDescription(place.assignment.kind);
  /** @type {{ status: string, code: string, search: string, sort: Column, descending: boolean }} */
  const state = { status: 'all', code: '', search: '', sort: 'studentId', descending: false };
  let rows = /** @type {ResultRow[]} */ (await api('GET', `${base}/results`));
  // The codes are the section's, not the assignment's: a failure there leaves the results page whole.
  const [deadline, codes] = await Promise.all([
    deadlinePanel(base, instructor, failure),
    accessCodesPanel(place, instructor, failure).catch(() => h('p', { class: 'hint' }, 'The students’ access codes could not be loaded; reload the page to try again.')),
  ]);
  // The signals compare every pair of students, which takes longer than the table: the table is drawn
  // first and the signals panel fills in when they arrive.
  const signalsSlot = h('div', { 'aria-live': 'polite' });
  const loadSignals = () =>
    api('GET', `${base}/signals`).then(
      (signals) => fill(signalsSlot, signalsPanel(/** @type {SectionSignals} */ (signals), kind?.signals ?? GENERAL_WORDS)),
      () => fill(signalsSlot, h('p', { class: 'hint' }, 'The signals for review could not be loaded; reload the page to try again.')),
    );
  loadSignals();

  const body = h('tbody');
  const shown = h('p', { class: 'hint', 'aria-live': 'polite' });
  /** @type {HTMLSelectElement} */
  const codeSelect = h('select', { id: 'filter-code', onchange: () => ((state.code = codeSelect.value), draw()) });
  const counts = h('div', { class: 'code-counts' });
  const releaseArea = h('div', { class: 'release' });
  const headRow = h('tr');

  /**
   * @param {ResultRow} a
   * @param {ResultRow} b
   */
  const compare = (a, b) => {
    const key = state.sort;
    // Lateness ranks held work above late above on time; findings by how many.
    const value = (/** @type {ResultRow} */ r) =>
      key === 'codes' ? r.codes.length : key === 'late' ? (r.held ? 2 : r.late ? 1 : 0) : key === 'gradeSent' ? (r.gradeSent ? SEND_RANK[r.gradeSent.state] : null) : r[key];
    const [x, y] = [value(a), value(b)];
    // A column holds words, numbers, or yes and no (false before true, as 0 before 1).
    const before = typeof x === 'string' && typeof y === 'string' ? x < y : Number(x) < Number(y);
    const rank = x === y ? 0 : x === null ? 1 : y === null ? -1 : before ? -1 : 1;
    return state.descending ? -rank : rank;
  };

  // The filter offers each code in the kind's words, the code kept as the value (and shown on hover).
  const findingWords = new Map((kind?.findings ?? []).map((f) => [f.code, f.label]));

  function drawCounts() {
    /** @type {Map<string, number>} */
    const byCode = new Map();
    for (const r of rows) for (const c of r.codes) byCode.set(c, (byCode.get(c) ?? 0) + 1);
    const codes = [...byCode.entries()].sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1));
    fill(codeSelect, h('option', { value: '' }, 'Any finding'), ...codes.map(([c, n]) => h('option', { value: c, title: c, selected: c === state.code }, `${findingWords.get(c) ?? c} (${n})`)));
    fill(counts,
      h('h3', {}, 'How many students share each finding'),
      codes.length === 0
        ? h('p', { class: 'hint' }, 'No findings yet.')
        : h('ul', { class: 'chips' }, codes.map(([c, n]) => h('li', {}, h('button', { type: 'button', class: `chip${state.code === c ? ' on' : ''}`, title: findingWords.get(c) ?? c, 'aria-pressed': String(state.code === c), onclick: () => ((state.code = state.code === c ? '' : c), draw()) }, `${c} · ${n}`)))),
    );
  }

  function drawRelease() {
    const pending = rows.filter(releaseDue).length;
    const changed = rows.filter(STATUS_FILTERS.changed[1]);
    const submitted = rows.some((r) => r.submissionId !== null);
    const label = pending > 0 ? 'Release results…' : submitted ? 'Every result is released' : 'Nothing to release yet';
    const ask = h('button', { type: 'button', class: 'primary', disabled: pending === 0, onclick: () => confirmRelease(pending, changed.length) }, label);
    // Students whose new result differs from what they were shown: named, and one click lists them.
    const note = changed.length
      ? h(
          'p',
          { class: 'changed-note' },
          `${plural(changed.length, 'student')} changed since release (they still see the released score): ${changed.map((r) => r.studentId).join(', ')}. `,
          h('button', { type: 'button', class: 'link', onclick: () => ((state.status = 'changed'), draw()) }, 'Show only them'),
        )
      : null;
    fill(releaseArea, ask, note, sendNote());
  }

  /**
   * @param {number} pending
   * @param {number} changed
   */
  function confirmRelease(pending, changed) {
    const results = plural(pending, 'result');
    const instead = 'will see the new result in place of the one they were shown';
    const which =
      changed === 0 ? '' : changed === 1 && pending === 1 ? ` It has changed since release: the student ${instead}.` : changed === pending ? ` All ${changed} have changed since release: the students ${instead}.` : ` ${pending - changed} not yet released, ${changed} changed since release (those students ${instead}).`;
    askToConfirm(releaseArea, {
      question: `Release ${results} of this section to the students?${which} They will see their feedback sheets; overrides can still be made later and are released the same way.`,
      yes: `Release ${results}`,
      act: async () => {
        const { released, held } = /** @type {Released} */ (await api('POST', `${base}/release`));
        rows = /** @type {ResultRow[]} */ (await api('GET', `${base}/results`));
        draw();
        releaseArea.append(h('p', { role: 'status' }, `${released} result${released === 1 ? '' : 's'} released to students.`, held ? ` ${plural(held, 'late submission')} held back until accepted.` : ''));
      },
      cancel: drawRelease,
      failure,
    });
  }

  /** The columns shown: "Grade sent" only where a learning platform takes this section's grades. */
  const columns = () => (rows.some((r) => r.gradeSent !== null) ? COLUMNS : COLUMNS.filter(([key]) => key !== 'gradeSent'));

  function drawHead() {
    fill(headRow,
      ...columns().map(([key, label]) => {
        const sorted = state.sort === key;
        return h(
          'th',
          { scope: 'col', 'aria-sort': sorted ? (state.descending ? 'descending' : 'ascending') : 'none' },
          h('button', { type: 'button', class: 'sort', onclick: () => ((state.descending = sorted && !state.descending), (state.sort = key), draw()) }, label, sorted ? (state.descending ? ' ▼' : ' ▲') : ''),
        );
      }),
    );
  }

  /**
   * Late work is marked; held work has the action that lets the next release include it.
   * @param {ResultRow} r
   */
  function lateCell(r) {
    if (r.held && r.submissionId !== null) {
      const id = r.submissionId;
      return [
        h('span', { class: 'held-mark' }, 'held until accepted '),
        h('button', { type: 'button', class: 'small', onclick: async () => {
          try {
            await api('POST', `/v1/submissions/${id}/accept-late`);
            await refresh();
          } catch (error) {
            failure(error);
          }
        } }, 'Accept late work'),
      ];
    }
    // On time is the rule: only late work is marked.
    return r.late ? h('span', { class: 'late-mark' }, 'late') : '';
  }

  /**
   * A grade send in words: sent (when), waiting (and why, once a try failed), or not sent with the reason.
   * @param {ResultRow} r
   */
  function sendCell(r) {
    const send = r.gradeSent;
    if (!send) return '';
    const when = new Date(send.at).toLocaleString();
    return [h('span', { class: `send-${send.state}`, title: send.state === 'sent' ? `sent ${when}` : `queued ${when}` }, SEND_WORDS[send.state]), send.reason ? [' ', h('span', { class: 'send-reason' }, send.reason)] : null];
  }

  /** Grades the platform did not take: how many, and the action that sends them again. */
  function sendNote() {
    const failed = rows.filter((r) => r.gradeSent?.state === 'failed').length;
    if (failed === 0) return null;
    return h(
      'p',
      { class: 'send-note' },
      `${plural(failed, 'grade')} could not be sent to the course's learning platform (the reasons are in the Grade sent column). `,
      h('button', { type: 'button', class: 'small', onclick: async () => {
        try {
          const { waiting } = /** @type {{ waiting: number }} */ (await api('POST', `${base}/passback`));
          await refresh();
          releaseArea.append(h('p', { role: 'status' }, `${plural(waiting, 'grade')} queued to be sent again.`));
        } catch (error) {
          failure(error);
        }
      } }, 'Send again'),
    );
  }

  function draw() {
    // The filter is also set from the changed-since-release note: the select follows it.
    statusSelect.value = state.status;
    drawHead();
    drawCounts();
    drawRelease();
    const keep = STATUS_FILTERS[state.status][1];
    const needle = state.search.trim().toLowerCase();
    const visible = rows.filter((r) => keep(r) && (!state.code || r.codes.includes(state.code)) && (!needle || r.studentId.toLowerCase().includes(needle))).sort(compare);
    fill(body,
      ...visible.map((r) =>
        h(
          'tr',
          { class: r.submissionId === null ? 'missing' : r.errors > 0 ? 'has-errors' : '' },
          h('th', { scope: 'row' }, r.submissionId === null ? r.studentId : h('a', { href: `#/section/${place.section.id}/assignment/${place.assignment.id}/submission/${r.submissionId}` }, r.studentId), r.submissionId !== null && r.enrolment === 'withdrawn' ? ' (withdrawn)' : ''),
          cell('version', {}, r.version ?? '–'),
          cell('submittedAt', { class: 'when', title: r.submittedAt ? new Date(r.submittedAt).toLocaleString() : undefined }, r.submittedAt ? [shortWhen(r.submittedAt), r.source === 'student' ? h('span', { class: 'source' }, 'by the student') : null] : ''),
          cell('late', {}, lateCell(r)),
          cell('status', {}, r.status === null ? '–' : (STATUS_WORDS[r.status] ?? r.status)),
          cell('score', { class: 'number' }, r.score === null ? '–' : `${num(r.score)} / ${num(r.maxScore)}`, r.changedSinceRelease ? h('span', { class: 'released-score' }, `released ${num(r.releasedScore)}${r.releasedVersion === r.version ? '' : ` (version ${r.releasedVersion})`}`) : null),
          cell('errors', { class: 'number' }, r.errors),
          cell('warnings', { class: 'number' }, r.warnings),
          cell('codes', {}, r.codes.join(', ')),
          cell('released', {}, r.submissionId === null ? '' : r.changedSinceRelease ? h('strong', { class: 'changed' }, 'changed since release') : r.released ? 'yes' : r.held ? 'held' : 'no'),
          cell('feedbackFirstReadAt', { class: 'when', title: r.feedbackFirstReadAt ? new Date(r.feedbackFirstReadAt).toLocaleString() : undefined }, r.feedbackFirstReadAt ? shortWhen(r.feedbackFirstReadAt) : r.released ? 'not yet' : ''),
          columns().length === COLUMNS.length ? cell('gradeSent', {}, sendCell(r)) : null,
        ),
      ),
    );
    shown.textContent = `Showing ${visible.length} of ${rows.length} students on the roster.`;
  }

  /** @type {HTMLSelectElement} */
  const statusSelect = h('select', { id: 'filter-status', onchange: () => ((state.status = statusSelect.value), draw()) }, Object.entries(STATUS_FILTERS).map(([value, [label]]) => h('option', { value }, label)));
  /** @type {HTMLInputElement} */
  const search = h('input', { id: 'filter-student', type: 'search', oninput: () => ((state.search = search.value), draw()) });
  const refresh = async () => {
    rows = /** @type {ResultRow[]} */ (await api('GET', `${base}/results`));
    draw();
    loadSignals();
  };
  draw();
  return h(
    'div',
    { class: 'section-view' },
    h('p', { class: 'crumbs' }, h('a', { href: '#/' }, 'Your sections'), ' / ', place.course.name),
    h('h1', {}, `Section ${place.section.name} · ${place.assignment.title}`),
    h(
      'div',
      { class: 'toolbar' },
      releaseArea,
      deadline,
      h(
        'nav',
        { class: 'downloads', 'aria-label': 'Downloads' },
        h('a', { href: `${base}/gradebook.csv?bom=true`, download: '' }, 'Gradebook (CSV)'),
        sectionDownload(`${base}/summary.pdf`, 'Section summary (PDF)', failure),
        sectionDownload(`${base}/feedback.zip`, 'Every feedback sheet (ZIP)', failure),
      ),
    ),
    uploadPanel(base, kind?.upload ?? { json: true }, refresh, failure),
    codes,
    signalsSlot,
    counts,
    h(
      'div',
      { class: 'filters' },
      h('label', { for: 'filter-status' }, 'Show'),
      statusSelect,
      h('label', { for: 'filter-code' }, 'Finding'),
      codeSelect,
      h('label', { for: 'filter-student' }, 'Student id'),
      search,
    ),
    shown,
    h('div', { class: 'table-wrap' }, h('table', { class: 'results cards' }, h('caption', {}, 'Latest result of each student'), h('thead', {}, headRow), body)),
  );
}
