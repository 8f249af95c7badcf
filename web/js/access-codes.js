import { api } from './api.js';
import { fill, h, when } from './dom.js';
import { askToConfirm } from './confirm.js';

/**
 * @import { Failure } from './api.js'
 * @import { Place } from './place.js'
 * @import { AccessCodeState, IssuedAccessCodes, RevokedAccessCodes } from '../../schemas/api/students.ts'
 * @typedef {AccessCodeState} CodeState
 * @typedef {IssuedAccessCodes['codes'][number]} IssuedCode
 */

/** Where a student signs in with their code: the students' pages of this service. */
const studentAddress = () => `${location.origin}/student`;

/**
 * A CSV cell for a mail merge: quoted where needed, and text a spreadsheet would run as a formula
 * (=, +, -, @ first) given a leading quote mark, as the gradebook does.
 * @param {string} value
 */
function csvCell(value) {
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** @param {IssuedCode[]} codes */
export function mailMergeCsv(codes) {
  const address = studentAddress();
  return ['studentId,displayName,code,address', ...codes.map((c) => [c.studentId, c.displayName ?? '', c.code, address].map(csvCell).join(','))].join('\r\n') + '\r\n';
}

/** A file name of letters, digits, `.`, `_` and `-`, as the service names its downloads. @param {string} text */
const fileSafe = (text) => text.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^_+|_+$/g, '');

/**
 * One slip per student for the printed list. The slips sit in the document's body, hidden on the
 * screen; printing the page prints them alone (style.css, print rules), until the page is left.
 * @param {Place} place
 * @param {IssuedCode[]} codes
 */
function printSlips(place, codes) {
  document.querySelector('body > .code-slips')?.remove();
  const slips = h(
    'div',
    { class: 'code-slips' },
    codes.map((c) =>
      h(
        'section',
        { class: 'code-slip' },
        h('p', {}, `${place.course.name}, section ${place.section.name}`),
        h('p', {}, 'Student ', h('strong', {}, c.studentId), c.displayName ? [': ', h('strong', {}, c.displayName)] : null),
        h('p', {}, 'Your access code: ', h('code', {}, c.code)),
        h('p', {}, 'Sign in at ', h('strong', {}, studentAddress()), ' to hand in your values and read your feedback. Keep the code to yourself.'),
      ),
    ),
  );
  document.body.append(slips);
  window.addEventListener('hashchange', () => slips.remove(), { once: true });
}

/**
 * The section's access codes: who has one (issued when), and for an instructor issuing them (the
 * whole section or one student), issuing again and revoking. New codes are shown once, with a
 * printable list and a CSV for a mail merge; the service keeps only their hashes.
 * @param {Place} place
 * @param {boolean} instructor
 * @param {Failure} failure
 */
export async function accessCodesPanel(place, instructor, failure) {
  const url = `/v1/sections/${place.section.id}/access-codes`;
  let states = /** @type {CodeState[]} */ (await api('GET', url));
  const list = h('table', { class: 'code-states cards' });
  const actions = h('div', { class: 'row' });
  const issued = h('div', { class: 'issued-codes', 'aria-live': 'polite' });
  const count = h('p', { class: 'hint' });

  /**
   * @param {string[] | undefined} studentIds none: every enrolled student of the section
   */
  async function issue(studentIds) {
    const { codes } = /** @type {IssuedAccessCodes} */ (await api('POST', url, studentIds ? { studentIds } : {}));
    states = /** @type {CodeState[]} */ (await api('GET', url));
    draw();
    showIssued(codes);
  }

  /** @param {string} studentId */
  async function revoke(studentId) {
    const { revoked } = /** @type {RevokedAccessCodes} */ (await api('POST', `${url}/revoke`, { studentIds: [studentId] }));
    states = /** @type {CodeState[]} */ (await api('GET', url));
    draw();
    fill(issued, h('p', { role: 'status' }, revoked ? `The code of ${studentId} is revoked; their sessions are ended.` : `${studentId} had no code to revoke.`));
  }

  /** @param {IssuedCode[]} codes */
  function showIssued(codes) {
    printSlips(place, codes);
    const csv = URL.createObjectURL(new Blob([mailMergeCsv(codes)], { type: 'text/csv' }));
    fill(issued,
      h('p', { class: 'caution', role: 'status' }, `${codes.length} code${codes.length === 1 ? '' : 's'} issued. They are shown only now: print the list or download the CSV before you leave this page. A code issued again replaces the old one.`),
      h('div', { class: 'row' },
        h('button', { type: 'button', class: 'primary', onclick: () => window.print() }, 'Print one slip per student'),
        h('a', { href: csv, download: `${fileSafe(place.course.name)}-${fileSafe(place.section.name)}-access-codes.csv` }, 'Download the CSV for a mail merge'),
      ),
      h('table', { class: 'code-list' },
        h('caption', {}, 'The new codes'),
        h('thead', {}, h('tr', {}, ['Student', 'Name', 'Code'].map((t) => h('th', { scope: 'col' }, t)))),
        h('tbody', {}, codes.map((c) => h('tr', {}, h('th', { scope: 'row' }, c.studentId), h('td', {}, c.displayName ?? ''), h('td', {}, h('code', {}, c.code))))),
      ),
    );
  }

  /**
   * Asks before a change that ends a student's way in (a new code replaces theirs; a revoked code
   * ends their sessions).
   * @param {string} question
   * @param {string} yes
   * @param {() => Promise<unknown>} act
   */
  function confirm(question, yes, act) {
    askToConfirm(actions, { question, yes, act: async () => (await act(), drawActions()), cancel: drawActions, failure });
  }

  function drawActions() {
    const holders = states.filter((s) => s.issuedAt).length;
    fill(actions,
      instructor
        ? h('button', { type: 'button', class: 'primary', disabled: states.length === 0, onclick: () => (holders ? confirm(`Issue a code to each of the ${states.length} students? The ${holders} code${holders === 1 ? '' : 's'} issued before stop working.`, `Issue ${states.length} codes`, () => issue(undefined)) : issue(undefined).catch(failure)) }, 'Issue codes for the whole section…')
        : h('p', { class: 'hint' }, 'An instructor issues and revokes the codes.'),
    );
  }

  function draw() {
    const holders = states.filter((s) => s.issuedAt).length;
    count.textContent = `${holders} of ${states.length} enrolled student${states.length === 1 ? '' : 's'} hold a code.`;
    fill(list,
      h('caption', {}, 'Enrolled students and their codes'),
      h('thead', {}, h('tr', {}, ['Student', 'Name', 'Code issued', instructor ? 'Change' : null].filter(Boolean).map((t) => h('th', { scope: 'col' }, t)))),
      h('tbody', {}, states.map((s) =>
        h('tr', {},
          h('th', { scope: 'row' }, s.studentId),
          h('td', { 'data-label': 'Name' }, s.displayName ?? ''),
          h('td', { 'data-label': 'Code issued' }, s.issuedAt ? when(s.issuedAt) : 'none'),
          instructor
            ? h('td', { class: 'code-actions' },
                h('button', { type: 'button', class: 'small', onclick: () => (s.issuedAt ? confirm(`Issue a new code to ${s.studentId}? Their old code stops working.`, 'Issue a new code', () => issue([s.studentId])) : issue([s.studentId]).catch(failure)) }, s.issuedAt ? 'Issue again' : 'Issue'),
                s.issuedAt ? h('button', { type: 'button', class: 'small', onclick: () => confirm(`Revoke the code of ${s.studentId}? They are signed out and cannot sign in until a new code is issued.`, 'Revoke the code', () => revoke(s.studentId)) }, 'Revoke') : null,
              )
            : null,
        ),
      )),
    );
    drawActions();
  }

  draw();
  return h(
    'details',
    { class: 'panel access-codes' },
    h('summary', {}, 'Students’ access codes'),
    h('p', { class: 'hint' }, `With a code a student signs in at ${studentAddress()} to hand in their values and read their feedback once it is released. The service keeps only a fingerprint of each code, so a lost code is issued again, never looked up.`),
    count,
    actions,
    issued,
    h('div', { class: 'table-wrap' }, list),
  );
}
