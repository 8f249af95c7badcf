import { api, ApiFailure } from './api.js';
import { fill, h, minuteWhen, zoneName } from './dom.js';

/**
 * @import { Failure } from './api.js'
 * @typedef {{ dueAt: string | null, setBy: string | null, setAt: string | null }} Deadline
 */

/** An instant as a datetime-local field's value, in the reader's time zone: `2026-12-07T17:00`. @param {string} iso */
function localValue(iso) {
  const d = new Date(iso);
  const pad = (/** @type {number} */ n) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/**
 * The section's deadline for the assignment: shown to every TA; an instructor sets or clears it, in
 * their own time zone (named beside the field), sent to the service as an instant.
 * @param {string} base the URL of the section's assignment
 * @param {boolean} instructor
 * @param {Failure} failure
 */
export async function deadlinePanel(base, instructor, failure) {
  let deadline = /** @type {Deadline} */ (await api('GET', `${base}/deadline`));
  const root = h('div', { class: 'deadline-area' });
  const message = h('p', { class: 'form-error', role: 'alert' });
  const status = h('span', { class: 'hint', role: 'status' });
  const said = () => (deadline.dueAt ? `Deadline ${minuteWhen(deadline.dueAt)} (${zoneName()} time)${deadline.setBy ? `, set by ${deadline.setBy}` : ''}` : 'No deadline: nothing handed in is late');

  /** @param {string | null} dueAt */
  async function save(dueAt) {
    message.textContent = '';
    try {
      deadline = /** @type {Deadline} */ (await api('PUT', `${base}/deadline`, { dueAt }));
      draw();
      status.textContent = dueAt ? 'Deadline saved.' : 'Deadline cleared.';
    } catch (error) {
      if (error instanceof ApiFailure && error.status === 400) message.textContent = error.details.map((d) => `${d.path.replace(/^body\.?/, '')}: ${d.message}`).join('; ') || error.message;
      else failure(error);
    }
  }

  function draw() {
    if (!instructor) return fill(root, h('p', { class: 'deadline' }, `${said()}.`));
    /** @type {HTMLInputElement} */
    const input = h('input', { id: 'deadline', type: 'datetime-local', value: deadline.dueAt ? localValue(deadline.dueAt) : '', required: true, 'aria-describedby': 'deadline-now' });
    fill(root,
      h('form', { class: 'deadline-form', onsubmit: (/** @type {Event} */ e) => (e.preventDefault(), save(input.value ? new Date(input.value).toISOString() : null)) },
        h('label', { for: 'deadline' }, `Deadline (${zoneName()} time)`),
        input,
        h('button', { type: 'submit' }, 'Save'),
        deadline.dueAt ? h('button', { type: 'button', class: 'quiet', onclick: () => save(null) }, 'Clear') : null,
        status,
      ),
      h('p', { class: 'hint', id: 'deadline-now' }, `${said()}. Work a student hands in after it is marked late; the assignment’s settings say what that costs.`),
      message,
    );
  }
  draw();
  return root;
}
