import { api, ApiFailure, setCsrfToken } from './api.js';
import { h } from './dom.js';

/** @import { Session } from '../../schemas/api/session.ts' */

/**
 * The sign-in form: the token goes to the service once and is not kept by the page.
 * @param {() => unknown} onSignedIn
 */
export function signInView(onSignedIn) {
  const message = h('p', { class: 'form-error', role: 'alert', id: 'sign-in-error' });
  const input = h('input', { id: 'token', name: 'token', type: 'password', autocomplete: 'off', required: true, 'aria-describedby': 'token-help sign-in-error' });
  const form = h(
    'form',
    {
      class: 'panel sign-in',
      onsubmit: async (event) => {
        event.preventDefault();
        message.textContent = '';
        try {
          const session = /** @type {Session} */ (await api('POST', '/v1/session', { token: input.value }));
          input.value = '';
          setCsrfToken(session.csrfToken);
          onSignedIn();
        } catch (error) {
          message.textContent = error instanceof ApiFailure ? error.message : 'The service could not be reached.';
        }
      },
    },
    h('h1', {}, 'Sign in'),
    h('label', { for: 'token' }, 'Staff token'),
    input,
    h('p', { id: 'token-help', class: 'hint' }, 'The token your instructor or the service administrator gave you. It is exchanged for a session that ends after 8 hours or when you sign out.'),
    h('button', { type: 'submit', class: 'primary' }, 'Sign in'),
    message,
    h('p', { class: 'hint other-door' }, 'Students: ', h('a', { href: '/student' }, 'sign in with your access code'), '.'),
  );
  return form;
}
