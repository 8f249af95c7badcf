import { api, ApiFailure, setCsrfToken } from './api.js';
import { fill, h } from './dom.js';

/**
 * @import { Children } from './dom.js'
 */

/**
 * What the staff workspace and the students' pages share around their own views: showing a view in
 * `main`, a failure shown in its place (an ended session sends the visitor back to sign in), the
 * signed-in line with its sign-out button in `who`.
 * @param {{ main: HTMLElement, who: HTMLElement, route: () => unknown, forget: (why: 'session-ended' | 'signed-out') => void }} page
 *   `route` draws the page for the address; `forget` drops what the page knew of the visitor.
 */
export function pageShell({ main, who, route, forget }) {
  /** @param {...Children} nodes */
  const show = (...nodes) => fill(main, ...nodes);

  /** @param {unknown} error */
  const failure = (error) => {
    if (error instanceof ApiFailure && error.status === 401) {
      forget('session-ended');
      return route();
    }
    show(h('p', { class: 'form-error', role: 'alert' }, error instanceof Error ? error.message : String(error)));
  };

  const signOut = async () => {
    try {
      await api('DELETE', '/v1/session');
    } finally {
      forget('signed-out');
      setCsrfToken(null);
      location.hash = '#/';
      route();
    }
  };

  /** The signed-in line: who, in words, and the sign-out button. @param {string} words */
  const header = (words) => fill(who, h('span', {}, words), h('button', { type: 'button', class: 'quiet', onclick: signOut }, 'Sign out'));

  return { show, failure, header };
}
