import type { EngineError } from '../engine/engine-error.ts';
import type { DraftFinding } from './draft-finding.ts';

/**
 * A run whose readings give no k of ours, in either kind: why, in words a student can act on, and
 * the finding that says so. No points: the student may have measured as well as the run allowed.
 */

/** Why the exponential fit of a run's readings failed; any other failure as the engine words it. */
export function whyRunNotFitted(run: { readings: readonly unknown[]; infinity?: number }, error: EngineError): string {
  if (error.code === 'too-few-points' && run.infinity === undefined) {
    return `it has ${run.readings.length} readings and no x_inf: the exponential fit then finds x_0, x_inf and k together and needs at least 4 readings (with x_inf measured, 3 would do)`;
  }
  if (error.code === 'no-convergence') return 'the exponential fit did not converge on these readings (they may not follow a first-order curve)';
  return error.message;
}

/** The finding on such a run: `subject` names it (`Run "0.05 M"`), `consequence` says what is then graded. */
export function runNotFittedDraft(where: { path: string; stage: DraftFinding['stage'] }, subject: string, why: string, consequence: string): DraftFinding {
  return { code: 'run-not-fitted', ...where, severity: 'warning', charge: 0, message: `${subject} cannot be fitted: ${why}. ${consequence}` };
}
