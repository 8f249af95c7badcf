import { h, when } from './dom.js';
import { deadlineText, lateMark, latePolicyText } from './student-words.js';

/** @import { StudentAssignment, StudentMe } from './student-types.js' */

/**
 * Where their feedback stands: not yet released, or released (and when they first read it).
 * @param {StudentAssignment} a
 */
function feedbackPart(a) {
  if (!a.feedback) return h('p', { class: 'feedback-state' }, 'Feedback: not released yet.');
  return h(
    'p',
    { class: 'feedback-state' },
    `Feedback on version ${a.feedback.version} released ${when(a.feedback.releasedAt)}`,
    a.feedback.firstReadAt ? `; first read ${when(a.feedback.firstReadAt)}. ` : '; not read yet. ',
    h('a', { href: `#/assignment/${a.id}/feedback` }, 'Read your feedback'),
  );
}

/** @param {StudentAssignment} a */
function assignmentPanel(a) {
  const versions = [...a.versions].sort((x, y) => y.version - x.version);
  return h(
    'section',
    { class: 'panel assignment' },
    h('h2', {}, a.title),
    h('p', { class: 'deadline' }, deadlineText(a.dueAt), '.'),
    a.dueAt ? h('p', { class: 'hint' }, latePolicyText(a.late)) : null,
    versions.length
      ? h('ul', { class: 'versions' }, versions.map((v) => h('li', {}, `Version ${v.version}, handed in ${when(v.submittedAt)}`, ' · ', h('span', { class: v.late ? 'late-mark' : 'on-time' }, lateMark(v)))))
      : h('p', { class: 'hint' }, 'Nothing handed in yet.'),
    feedbackPart(a),
    h('p', {}, h('a', { class: 'button-link', href: `#/assignment/${a.id}/submit` }, versions.length ? 'Hand in a new version' : 'Hand in your values')),
  );
}

/**
 * The student's home: each assignment of their course with its deadline, their versions and their
 * feedback. Nothing of any other student is on it.
 * @param {StudentMe} me
 */
export function assignmentsView(me) {
  return h(
    'div',
    { class: 'student-home' },
    h('h1', {}, `${me.course.name}, section ${me.section.name}`),
    me.assignments.length ? me.assignments.map(assignmentPanel) : h('p', {}, 'No assignments yet.'),
  );
}
