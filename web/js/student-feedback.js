import { api, ApiFailure } from './api.js';
import { h, num, when } from './dom.js';
import { comparisonTable, plotFigures, rejectedList, stageSections } from './display-parts.js';

/** @import { StudentAssignment, StudentFeedback } from './student-types.js' */

/**
 * A student's released feedback on one assignment, drawn as the staff see the result (the same
 * parts), without the staff's controls: the score, the findings in words, their values against the
 * refit, the plots, and the sheet as PDF. Before release there is nothing to read.
 * @param {StudentAssignment} assignment
 */
export async function feedbackView(assignment) {
  const base = `/v1/student/assignments/${assignment.id}`;
  const crumbs = h('p', { class: 'crumbs' }, h('a', { href: '#/' }, 'Your assignments'), ' / ', assignment.title);
  const notYet = () => h('div', { class: 'student-feedback' }, crumbs, h('h1', {}, `Feedback: ${assignment.title}`), h('p', { role: 'status' }, 'Your feedback on this assignment is not released yet.'));
  // Their assignments say whether anything is released: nothing is asked for before then.
  if (!assignment.feedback) return notYet();
  /** @type {StudentFeedback} */
  let feedback;
  try {
    feedback = /** @type {StudentFeedback} */ (await api('GET', `${base}/feedback`));
  } catch (error) {
    if (error instanceof ApiFailure && error.status === 404) return notYet();
    throw error;
  }
  const { display } = feedback;
  return h(
    'div',
    { class: 'student-feedback' },
    crumbs,
    h('h1', {}, `Feedback: ${assignment.title}`),
    h('div', { class: 'toolbar' }, h('p', {}, `On your version ${feedback.version}, released ${when(feedback.releasedAt)}.`), h('nav', { class: 'downloads', 'aria-label': 'Downloads' }, h('a', { href: `${base}/feedback.pdf`, download: '' }, 'Feedback sheet (PDF)'))),
    h('p', { class: 'score' }, feedback.score === null ? 'Not graded: your data could not be checked' : `Score ${num(feedback.score)} of ${num(feedback.maxScore)}`),
    h('p', { class: 'caution' }, 'Each cause named below is a likely cause read from your numbers, which your teaching staff have reviewed. If one seems wrong to you, ask them.'),
    rejectedList(display.rejected),
    display.counts && display.stages.length ? h('p', { class: 'counts' }, display.counts) : null,
    stageSections(display, () => []),
    display.stages.length === 0 && feedback.score !== null ? h('p', {}, 'No findings: every checked value agrees with the refit.') : null,
    display.comparison || display.plots.length
      ? h('section', {}, h('h2', {}, 'Your values and ours'), display.comparison ? comparisonTable(display.comparison) : null, plotFigures(display.plots, 'Drawn as on your feedback sheet: solid lines are our refit of your readings, dashed lines your own values.'))
      : null,
  );
}
