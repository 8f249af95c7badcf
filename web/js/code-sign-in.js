import { api, ApiFailure, setCsrfToken } from './api.js';
import { h } from './dom.js';

/** @import { Session } from '../../schemas/api/session.ts' */

/**
 * What a refused code is told, by status: the service answers a wrong, revoked or withdrawn
 * student's code alike, so the page cannot say which and does not guess.
 * @param {unknown} error
 */
export function codeRefusal(error) {
  if (!(error instanceof ApiFailure)) return 'The service could not be reached. Check your connection and try again.';
  if (error.status === 401) return 'That code is not valid. Check it against the slip you were given; a code that was issued again or withdrawn no longer works.';
  if (error.status === 429) return 'Too many tries from this address. Wait a minute, then try again.';
  if (error.status === 400) return error.details.length ? error.details.map((d) => `${d.path.replace(/^body\.?/, '') || 'code'}: ${d.message}`).join('; ') : error.message;
  return error.message;
}

/**
 * A student's sign-in with the access code their instructor gave them. The code goes to the service
 * once and is not kept by the page; the session lasts 8 hours or until they sign out.
 * @param {() => unknown} onSignedIn
 * @param {string} [note] why they are asked (their session ended, or staff are signed in here)
 */
export function codeSignInView(onSignedIn, note) {
  const message = h('p', { class: 'form-error', role: 'alert', id: 'code-error' });
  const input = h('input', { id: 'access-code', name: 'code', type: 'text', autocomplete: 'off', autocapitalize: 'characters', spellcheck: 'false', required: true, placeholder: 'XXXX-XXXX-XXXX', 'aria-describedby': 'code-help code-error' });
  return h(
    'form',
    {
      class: 'panel sign-in',
      onsubmit: async (/** @type {Event} */ event) => {
        event.preventDefault();
        message.textContent = '';
        try {
          const session = /** @type {Session} */ (await api('POST', '/v1/student/session', { code: input.value }));
          input.value = '';
          setCsrfToken(session.csrfToken);
          onSignedIn();
        } catch (error) {
          message.textContent = codeRefusal(error);
        }
      },
    },
    h('h1', {}, 'Your lab work'),
    note ? h('p', { role: 'status' }, note) : null,
    h('label', { for: 'access-code' }, 'Access code'),
    input,
    h('p', { id: 'code-help', class: 'hint' }, 'The 12-character code on the slip from your instructor; dashes, spaces and small letters do not matter. You stay signed in for 8 hours or until you sign out.'),
    h('button', { type: 'submit', class: 'primary' }, 'Sign in'),
    message,
    h('p', { class: 'hint other-door' }, 'Teaching staff: ', h('a', { href: '/' }, 'sign in with your staff token'), '.'),
  );
}
