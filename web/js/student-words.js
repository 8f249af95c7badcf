import { minuteWhen, zoneName } from './dom.js';

/**
 * Words the student's pages share: the deadline with the reader's time zone, the assignment's late
 * policy, a version's marks.
 *
 * @import { LateWork, StudentVersion } from './student-types.js'
 */

/** @param {string | null} dueAt */
export function deadlineText(dueAt) {
  return dueAt ? `Due ${minuteWhen(dueAt)} (${zoneName()} time)` : 'No deadline set';
}

/**
 * What happens to work handed in after the deadline.
 * @param {LateWork} late
 */
export function latePolicyText(late) {
  if (late.policy === 'deduct') return `Work handed in after the deadline is marked late and loses ${late.points} point${late.points === 1 ? '' : 's'}.`;
  if (late.policy === 'hold') return 'Work handed in after the deadline is marked late and waits for your teaching assistant to accept it; until then no feedback on it is released.';
  return 'Work handed in after the deadline is marked late and graded as usual.';
}

/** @param {Pick<StudentVersion, 'late' | 'held'>} v */
export function lateMark(v) {
  return v.held ? 'late, waiting to be accepted' : v.late ? 'late' : 'on time';
}
