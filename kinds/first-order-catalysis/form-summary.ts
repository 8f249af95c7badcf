import { perUnitLine, readingsLine, reportedLines } from '../../server/checks/form-lines.ts';
import type { Submission } from './schemas.ts';

/** What a catalysis submission's form holds: its runs and readings, each run's end value, ln F column and k, and k_N, k_A. */
export function catalysisFormSummary(submission: Submission): string[] {
  const runs = submission.runs;
  const withK = runs.filter((r) => r.reported?.k !== undefined);
  const reported = submission.reported ?? {};
  return [
    readingsLine(runs.map((r) => r.readings.length)),
    perUnitLine('end value x_inf', runs.map((r) => r.infinity !== undefined), 'run', 'given'),
    perUnitLine('ln F column', runs.map((r) => r.reported?.lnF !== undefined)),
    perUnitLine('k', runs.map((r) => r.reported?.k !== undefined)),
    // Only of the runs with a k: a missing k has been said above.
    ...(withK.length > 0 ? [perUnitLine('the standard error of k', runs.map((r) => (r.reported?.k === undefined ? null : r.reported.k.uncertainty !== undefined)))] : []),
    ...reportedLines([
      { name: 'k_N', value: reported.kN },
      { name: 'k_A', value: reported.kA },
      // The equilibrium block's values, asked only by some assignments: named when given.
      { name: 'K', value: reported.K, optional: true },
      { name: 'k_N,f', value: reported.kNf, optional: true },
      { name: 'k_N,r', value: reported.kNr, optional: true },
      { name: 'k_A,f', value: reported.kAf, optional: true },
      { name: 'k_A,r', value: reported.kAr, optional: true },
    ]),
  ];
}
