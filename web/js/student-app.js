import { api, setCsrfToken } from './api.js';
import { fill } from './dom.js';
import { codeSignInView } from './code-sign-in.js';
import { assignmentsView } from './student-assignments.js';
import { feedbackView } from './student-feedback.js';
import { submitView } from './student-submit.js';
import { pageShell } from './page-shell.js';

/**
 * @import { StudentMe } from './student-types.js'
 * @import { SessionState } from '../../schemas/api/session.ts'
 */

/**
 * The students' own pages (/student): sign in with an access code, then their assignments, handing
 * one in (#/assignment/3/submit) and its released feedback (#/assignment/3/feedback). Every answer
 * comes from the /v1/student routes, which know the student from the session alone.
 */

// Both are in student.html, which loads this module.
const main = /** @type {HTMLElement} */ (document.getElementById('main'));
const who = /** @type {HTMLElement} */ (document.getElementById('who'));
/** @type {StudentMe | null} */
let me = null;
/** Why the sign-in form is shown again, once. @type {string | undefined} */
let signInNote;

const { show, failure, header: signedInLine } = pageShell({
  main,
  who,
  route: () => route(),
  forget: (why) => {
    me = null;
    if (why === 'session-ended') signInNote = 'Your session has ended. Enter your access code again.';
  },
});

/** @param {StudentMe} student */
function header(student) {
  signedInLine(`Signed in as ${student.displayName ? `${student.displayName} (${student.studentId})` : student.studentId}`);
}

async function readMe() {
  me = /** @type {StudentMe} */ (await api('GET', '/v1/student/me'));
  setCsrfToken(me.csrfToken);
  return me;
}

/** Each call of route() takes a turn: a view that is ready after a later turn began is not shown. */
let turns = 0;

async function route() {
  const turn = ++turns;
  const stale = () => turn !== turns;
  try {
    if (!me) {
      const state = /** @type {SessionState} */ (await api('GET', '/v1/session'));
      if (!state.signedIn || state.as !== 'student') {
        fill(who);
        show(codeSignInView(route, state.signedIn ? 'This browser is signed in to the staff workspace; signing in with a code here ends that session.' : signInNote));
        signInNote = undefined;
        return;
      }
    }
    // Read afresh at each turn: a version handed in, a release or a first read since shows at once.
    await readMe();
    const student = /** @type {StudentMe} */ (me);
    header(student);
    const m = /^#\/assignment\/(\d+)\/(submit|feedback)$/.exec(location.hash);
    const assignment = m && student.assignments.find((a) => a.id === Number(m[1]));
    const view = !m || !assignment ? assignmentsView(student) : m[2] === 'submit' ? await submitView(student, assignment, failure) : await feedbackView(assignment);
    if (stale()) return;
    show(view);
    // Focus moves to the new content for keyboard and screen-reader users; the page starts at its top.
    main.focus({ preventScroll: true });
    window.scrollTo(0, 0);
  } catch (error) {
    failure(error);
  }
}

window.addEventListener('hashchange', route);
route();
