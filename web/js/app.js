import { api, setCsrfToken } from './api.js';
import { fill, h } from './dom.js';
import { courseView } from './course-view.js';
import { sectionView } from './section-view.js';
import { signInView } from './sign-in.js';
import { pageShell } from './page-shell.js';
import { studentView } from './student-view.js';

/**
 * @import { Place } from './place.js'
 * @import { Me } from '../../schemas/api/me.ts'
 * @import { SessionState } from '../../schemas/api/session.ts'
 */

/**
 * The workspace: one page, its place kept in the address (#/section/1/assignment/2, and
 * /submission/7 for one student), so the browser's back button and bookmarks work.
 */

// Both are in index.html, which loads this module.
const main = /** @type {HTMLElement} */ (document.getElementById('main'));
const who = /** @type {HTMLElement} */ (document.getElementById('who'));
/** @type {Me | null} */
let me = null;

const { show, failure, header: signedInLine } = pageShell({
  main,
  who,
  route: () => route(),
  forget: () => {
    me = null;
  },
});

/** @param {Me} caller */
function header(caller) {
  const role = { ta: 'teaching assistant', instructor: 'instructor', admin: 'administrator' }[caller.role];
  signedInLine(`Signed in as ${caller.handle ?? 'admin'} (${role})`);
}

/**
 * The courses, sections and assignments the caller may open.
 * @param {Me} caller
 */
function home(caller) {
  const list = caller.courses.map((course) =>
    h(
      'section',
      { class: 'panel' },
      h('h2', {}, course.name),
      caller.role === 'instructor' ? h('p', {}, h('a', { href: `#/course/${course.id}` }, 'Manage the course: assignments, rosters, staff')) : null,
      course.sections.length === 0
        ? h('p', { class: 'hint' }, 'No section of this course is assigned to you.')
        : h(
            'ul',
            { class: 'picker' },
            course.sections.map((section) =>
              h(
                'li',
                {},
                h('span', { class: 'picker-section' }, `Section ${section.name}`),
                course.assignments.length === 0
                  ? h('span', { class: 'hint' }, ' no assignments yet')
                  : course.assignments.map((a) => h('a', { class: 'chip', href: `#/section/${section.id}/assignment/${a.id}` }, a.title)),
              ),
            ),
          ),
    ),
  );
  show(h('h1', {}, 'Your sections'), ...list);
}

/**
 * @param {Me} caller
 * @param {number} sectionId
 * @param {number} assignmentId
 * @returns {Place | undefined}
 */
function context(caller, sectionId, assignmentId) {
  for (const course of caller.courses) {
    const section = course.sections.find((s) => s.id === sectionId);
    const assignment = course.assignments.find((a) => a.id === assignmentId);
    if (section && assignment) return { course, section, assignment };
  }
  return undefined;
}

/** Each call of route() takes a turn: a view that is ready after a later turn began is not shown. */
let turns = 0;

async function route() {
  const turn = ++turns;
  const stale = () => turn !== turns;
  try {
    if (!me) {
      // The probe answers 200 either way, so a visitor not yet signed in sees no failed request.
      const state = /** @type {SessionState} */ (await api('GET', '/v1/session'));
      // A student's session belongs on the students' pages.
      if (state.as === 'student') return location.replace('/student');
      if (!state.signedIn) {
        fill(who);
        show(signInView(route));
        return;
      }
      me = /** @type {Me} */ (await api('GET', '/v1/me'));
      setCsrfToken(me.csrfToken);
    }
    header(me);
    const c = /^#\/course\/(\d+)$/.exec(location.hash);
    const course = c && me.role === 'instructor' && me.courses.find((x) => x.id === Number(c[1]));
    if (course) {
      const view = await courseView(course, failure, () => ((me = null), route()));
      if (stale()) return;
      show(view);
      main.focus({ preventScroll: true });
      window.scrollTo(0, 0);
      return;
    }
    const m = /^#\/section\/(\d+)\/assignment\/(\d+)(?:\/submission\/(\d+))?$/.exec(location.hash);
    let place = m && context(me, Number(m[1]), Number(m[2]));
    if (m && !place) {
      // An assignment made since the caller's list was read (on this page or another): read it once more.
      me = /** @type {Me} */ (await api('GET', '/v1/me'));
      setCsrfToken(me.csrfToken);
      place = context(me, Number(m[1]), Number(m[2]));
    }
    if (stale()) return;
    if (!m || !place) return home(me);
    const view = m[3] ? await studentView(place, Number(m[3]), failure) : await sectionView(place, failure, me.role === 'instructor');
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
