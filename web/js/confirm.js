import { fill, h } from './dom.js';

/** @import { Failure } from './api.js' */

/**
 * Asks before an action that reaches students or ends access: the question in `area`, the action's
 * button (focused) and Cancel. `act` runs on yes; an error goes to `failure`; `cancel` redraws.
 * @param {Element} area
 * @param {{ question: string, yes: string, act: () => Promise<unknown>, cancel: () => void, failure: Failure }} choice
 */
export function askToConfirm(area, { question, yes, act, cancel, failure }) {
  const button = h('button', { type: 'button', class: 'primary', onclick: async () => {
    try {
      await act();
    } catch (error) {
      failure(error);
    }
  } }, yes);
  fill(area, h('p', { role: 'alert' }, question), button, ' ', h('button', { type: 'button', class: 'quiet', onclick: cancel }, 'Cancel'));
  button.focus();
}
