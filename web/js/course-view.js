import { api, ApiFailure } from './api.js';
import { fill, h, when } from './dom.js';
import { askToConfirm } from './confirm.js';
import { settingsForm } from './settings-form.js';

/**
 * @import { Failure } from './api.js'
 * @import { Assignment, LatestRegradeView, RegradeProgressView } from '../../schemas/api/assignments.ts'
 * @import { IssuedToken, RevokedTokens, StaffMember } from '../../schemas/api/courses.ts'
 * @import { MyCourse } from '../../schemas/api/me.ts'
 * @import { Enrolment, RosterAdded, RosterStudent } from '../../schemas/api/rosters.ts'
 */

/**
 * An instructor's course: assignments (settings, regrades), each section's roster, and the staff.
 * @param {MyCourse} course
 * @param {Failure} failure
 * @param {() => unknown} reload after a new assignment, which the caller's listing must name
 */
export async function courseView(course, failure, reload) {
  const [assignments, staff, rosters] = await Promise.all([
    Promise.all(course.assignments.map((a) => /** @type {Promise<Assignment>} */ (api('GET', `/v1/assignments/${a.id}`)))),
    /** @type {Promise<StaffMember[]>} */ (api('GET', `/v1/courses/${course.id}/staff`)),
    Promise.all(course.sections.map((s) => /** @type {Promise<RosterStudent[]>} */ (api('GET', `/v1/sections/${s.id}/roster`)))),
  ]);
  return h(
    'div',
    { class: 'course-view' },
    h('p', { class: 'crumbs' }, h('a', { href: '#/' }, 'Your sections'), ' / ', course.name),
    h('h1', {}, `Manage ${course.name}`),
    h('section', {}, h('h2', {}, 'Assignments'), assignments.map((a) => assignmentPanel(a, failure)), newAssignment(course, failure, reload)),
    h('section', {}, h('h2', {}, 'Rosters'), course.sections.map((section, i) => rosterPanel(section, rosters[i], failure))),
    h('section', {}, h('h2', {}, 'Staff'), staffPanel(course, staff, failure)),
  );
}

/**
 * @param {Assignment} assignment
 * @param {Failure} failure
 */
function assignmentPanel(assignment, failure) {
  const status = h('p', { class: 'hint' }, `Settings version ${assignment.settingsVersion}.`);
  const edit = h('details', {}, h('summary', {}, 'Edit the settings'), settingsForm({ assignment, failure, done: (saved) => {
    assignment = saved;
    status.textContent = `Settings version ${saved.settingsVersion} saved ${when(new Date().toISOString())}. Regrade to apply it to stored work.`;
  } }));
  /** @type {HTMLButtonElement} */
  const regrade = h('button', { type: 'button', onclick: () => followRegrade(area, regrade, failure, () => api('POST', `/v1/assignments/${assignment.id}/regrade`, {})) }, 'Regrade every submission');
  const area = h('div', { class: 'regrade', 'aria-live': 'polite' });
  // A regrade goes on without the page: one started before a reload (here or elsewhere) is found and followed.
  void (/** @type {Promise<LatestRegradeView>} */ (api('GET', `/v1/assignments/${assignment.id}/regrades/latest`))).then(
    ({ regrade: latest }) => {
      if (latest && !regrade.disabled) void followRegrade(area, regrade, failure, async () => latest);
    },
    failure,
  );
  return h('article', { class: 'panel' }, h('h3', {}, assignment.title), status, edit, h('div', { class: 'row' }, regrade, area));
}

/**
 * Shows a regrade's progress from the server until it stops, the button disabled meanwhile.
 * @param {Element} area
 * @param {HTMLButtonElement} button
 * @param {Failure} failure
 * @param {() => Promise<unknown>} first the regrade as first known: started now, or found running
 */
async function followRegrade(area, button, failure, first) {
  button.disabled = true;
  const bar = h('progress', { max: '1', value: '0', 'aria-label': 'Regrade progress' });
  const text = h('span', {}, 'Starting…');
  fill(area, bar, ' ', text);
  try {
    let run = /** @type {RegradeProgressView} */ (await first());
    while (run.status === 'running') {
      bar.max = Math.max(run.total, 1);
      bar.value = run.done;
      // The regrade runs on the server as jobs: leaving the page does not stop it.
      text.textContent = `${run.done} of ${run.total} regraded; it goes on if you leave this page`;
      await new Promise((r) => setTimeout(r, 400));
      run = /** @type {RegradeProgressView} */ (await api('GET', `/v1/assignments/${run.assignmentId}/regrades/${run.regradeId}`));
    }
    bar.max = Math.max(run.total, 1);
    // A finished regrade shows a full bar, of nothing to regrade too.
    bar.value = run.status === 'finished' ? bar.max : run.done;
    text.textContent = run.status === 'finished' ? `Regrade finished${run.finishedAt ? ` ${when(run.finishedAt)}` : ''}: ${run.done} of ${run.total} submissions regraded.` : `Regrade stopped: ${run.error ?? 'unknown reason'}. Results stored before it stopped stay; starting again is safe.`;
  } catch (error) {
    failure(error);
  } finally {
    button.disabled = false;
  }
}

/**
 * @param {MyCourse} course
 * @param {Failure} failure
 * @param {() => unknown} reload
 */
function newAssignment(course, failure, reload) {
  return h('details', { class: 'panel' }, h('summary', {}, 'New assignment'), settingsForm({ courseId: course.id, failure, done: () => reload() }));
}

/** @type {[Enrolment, string][]} */
const ENROLMENT = [['enrolled', 'enrolled'], ['withdrawn', 'withdrawn'], ['removed', 'removed (kept in history)']];

/**
 * @param {MyCourse['sections'][number]} section
 * @param {RosterStudent[]} roster
 * @param {Failure} failure
 */
function rosterPanel(section, roster, failure) {
  const list = h('table', { class: 'roster cards' });
  const heading = h('h3', {});
  /** @param {RosterStudent[]} rows */
  const draw = (rows) => {
    heading.textContent = `Section ${section.name}: ${rows.length} student${rows.length === 1 ? '' : 's'}`;
    fill(
      list,
      h('caption', {}, 'Roster, with each student’s enrolment and its last change'),
      h('thead', {}, h('tr', {}, ['Student', 'Enrolment', 'Last change'].map((t) => h('th', { scope: 'col' }, t)))),
      h(
        'tbody',
        {},
        rows.map((r) => {
          const last = r.history[r.history.length - 1];
          /** @type {HTMLSelectElement} */
          const choose = h(
            'select',
            { 'aria-label': `Enrolment of ${r.studentId}`, onchange: async () => {
              try {
                await api('PUT', `/v1/sections/${section.id}/roster/${encodeURIComponent(r.studentId)}`, { status: choose.value });
                draw(/** @type {RosterStudent[]} */ (await api('GET', `/v1/sections/${section.id}/roster`)));
              } catch (error) {
                failure(error);
              }
            } },
            ENROLMENT.map(([v, text]) => h('option', { value: v, selected: v === r.status }, text)),
          );
          return h('tr', { class: r.status === 'enrolled' ? '' : 'missing' }, h('th', { scope: 'row' }, r.studentId), h('td', {}, choose), h('td', { class: 'hint' }, last ? `${last.status} by ${last.by ?? 'the administrator'}, ${when(last.at)}` : ''));
        }),
      ),
    );
  };
  draw(roster);
  const idsId = `roster-add-${section.id}`;
  const ids = h('textarea', { id: idsId, rows: '3', 'aria-describedby': `${idsId}-message` });
  const message = h('p', { id: `${idsId}-message`, class: 'form-error', role: 'alert' });
  const done = h('p', { role: 'status', class: 'hint' });
  /** @param {Event} e */
  const add = async (e) => {
    e.preventDefault();
    message.textContent = '';
    done.textContent = '';
    try {
      // The box's text as it is: the service reads one id per line and names any line that is not one.
      const { added, reenrolled, alreadyEnrolled } = /** @type {RosterAdded} */ (await api('POST', `/v1/sections/${section.id}/roster`, ids.value, 'text/plain'));
      ids.value = '';
      draw(/** @type {RosterStudent[]} */ (await api('GET', `/v1/sections/${section.id}/roster`)));
      const counts = [`${added} student${added === 1 ? '' : 's'} added`, reenrolled ? `${reenrolled} enrolled again` : '', alreadyEnrolled ? `${alreadyEnrolled} already enrolled` : ''];
      done.textContent = `${counts.filter(Boolean).join('; ')}.`;
    } catch (error) {
      if (error instanceof ApiFailure && error.status >= 400 && error.status < 500 && error.status !== 401) message.textContent = [`${error.message}.`, ...error.details.map((d) => `${d.path.replace(/^body /, '').replace(/^line/, 'Line')}: ${d.message}.`)].join(' ');
      else failure(error);
    }
  };
  return h(
    'article',
    { class: 'panel' },
    heading,
    // Scrolls sideways on a narrow screen rather than clipping the last column.
    h('div', { class: 'table-wrap' }, list),
    h('form', { class: 'roster-add', onsubmit: add }, h('label', { for: idsId }, 'Add students (pseudonymous ids, one per line)'), ids, h('button', { type: 'submit' }, 'Add to the roster'), message, done),
  );
}

/**
 * @param {MyCourse} course
 * @param {StaffMember[]} staff
 * @param {Failure} failure
 */
function staffPanel(course, staff, failure) {
  const sectionName = new Map(course.sections.map((s) => [s.id, s.name]));
  const rows = h('tbody');
  const shown = h('div', { 'aria-live': 'polite' });
  /** @param {StaffMember[]} members */
  const draw = (members) =>
    fill(
      rows,
      members.map((m) =>
        h(
          'tr',
          {},
          h('th', { scope: 'row' }, m.handle),
          h('td', {}, m.role === 'ta' ? 'teaching assistant' : 'instructor'),
          h('td', { 'data-label': 'Sections' }, m.sectionIds.map((id) => sectionName.get(id) ?? id).join(', ')),
          h('td', { class: 'number', 'data-label': 'Live tokens' }, m.liveTokens),
          h(
            'td',
            {},
            m.role === 'ta'
              ? [
                  h('button', { type: 'button', onclick: () => issue(m) }, 'Issue a token'),
                  ' ',
                  h('button', { type: 'button', class: 'quiet', disabled: m.liveTokens === 0, onclick: () => revoke(m) }, 'Revoke tokens…'),
                ]
              : null,
          ),
        ),
      ),
    );
  const refresh = async () => draw(/** @type {StaffMember[]} */ (await api('GET', `/v1/courses/${course.id}/staff`)));
  /** @param {StaffMember} member */
  async function issue(member) {
    try {
      const { token } = /** @type {IssuedToken} */ (await api('POST', `/v1/staff/${member.id}/tokens`));
      fill(shown, h('p', { role: 'status' }, `Token for ${member.handle}, shown this once (give it to them; it is stored only as a hash): `, h('code', { class: 'token' }, token)));
      await refresh();
    } catch (error) {
      failure(error);
    }
  }
  /** @param {StaffMember} member */
  function revoke(member) {
    askToConfirm(shown, {
      question: `Revoke every token of ${member.handle}? Their requests and browser sessions stop working at once.`,
      yes: `Revoke every token of ${member.handle}`,
      act: async () => {
        const { revoked } = /** @type {RevokedTokens} */ (await api('POST', `/v1/staff/${member.id}/tokens/revoke`));
        fill(shown, h('p', { role: 'status' }, `${revoked} token${revoked === 1 ? '' : 's'} of ${member.handle} revoked; their sessions are ended.`));
        await refresh();
      },
      cancel: () => fill(shown),
      failure,
    });
  }
  draw(staff);

  const handleId = `staff-handle-${course.id}`;
  const handle = h('input', { id: handleId, type: 'text', 'aria-describedby': `${handleId}-message` });
  const checks = course.sections.map((s) => h('input', { type: 'checkbox', value: String(s.id) }));
  const boxes = course.sections.map((s, i) => h('label', { class: 'check' }, checks[i], ` Section ${s.name}`));
  const message = h('p', { id: `${handleId}-message`, class: 'form-error', role: 'alert' });
  /** @param {Event} e */
  const addTa = async (e) => {
    e.preventDefault();
    message.textContent = '';
    const sectionIds = checks.filter((i) => i.checked).map((i) => Number(i.value));
    try {
      await api('POST', `/v1/courses/${course.id}/staff`, { handle: handle.value, role: 'ta', sectionIds });
      handle.value = '';
      await refresh();
    } catch (error) {
      if (error instanceof ApiFailure && (error.status === 400 || error.status === 409)) message.textContent = [error.message, ...error.details.map((d) => `${d.path.replace('body.', '')}: ${d.message}`)].join(' ');
      else failure(error);
    }
  };
  return h(
    'div',
    { class: 'panel' },
    h('table', { class: 'staff cards' }, h('caption', {}, 'Staff of the course'), h('thead', {}, h('tr', {}, ['Handle', 'Role', 'Sections', 'Live tokens', ''].map((t) => h('th', { scope: 'col' }, t)))), rows),
    shown,
    h('form', { class: 'staff-add', onsubmit: addTa }, h('h3', {}, 'Add a teaching assistant'), h('label', { for: handleId }, 'Handle (letters, digits, dot, underscore or hyphen)'), handle, h('fieldset', {}, h('legend', {}, 'Sections they teach'), boxes), h('button', { type: 'submit' }, 'Add'), message),
  );
}
