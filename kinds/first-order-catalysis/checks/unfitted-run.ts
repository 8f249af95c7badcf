import type { SubmittedRun } from '../schemas.ts';
import { rateUnitOf } from '../../../server/engine/units.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { readableIn } from '../../../server/checks/reported-number.ts';
import { runNotFittedDraft } from '../../../server/checks/run-not-fitted.ts';
import type { StudentK } from './check-run-k.ts';
import type { UnfittedRun } from './run-analysis.ts';

/**
 * The finding on a run its data cannot be fitted for (no points: the student may have measured as
 * well as the run allowed). Its ln F column, k and SE leave the maximum; the rest is graded.
 */
export function unfittedRunDraft(a: UnfittedRun): DraftFinding {
  return runNotFittedDraft(
    { path: a.notFitted.path, stage: 'run' },
    `Run "${a.label}"`,
    a.notFitted.message,
    'Its k_obs (and ln F column) are not graded and are left out of the maximum; the other runs and the rate law are graded without it.',
  );
}

/**
 * The k the student reports for a run we have no k for (not fitted, or undetermined), in the run's
 * rate unit, for the line through their own k_obs; none if its unit cannot be read.
 */
export function theirUngradedK(run: SubmittedRun, a: Pick<UnfittedRun, 'timeUnit'>): StudentK | undefined {
  return run.reported?.k && readableIn(run.reported.k, rateUnitOf(a.timeUnit));
}
