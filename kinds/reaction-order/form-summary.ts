import { perUnitLine, readingsLine, reportedLines } from '../../server/checks/form-lines.ts';
import type { Submission } from './schemas.ts';

/** What a reaction-order submission's form holds: its runs and readings, each run's [A]_0 and half-life, the order and k. */
export function reactionOrderFormSummary(submission: Submission): string[] {
  const runs = submission.runs;
  return [
    readingsLine(runs.map((r) => r.readings.length)),
    perUnitLine('[A]_0', runs.map((r) => r.initialConcentration !== undefined), 'run', 'given'),
    perUnitLine('half-life', runs.map((r) => r.reported?.halfLife !== undefined)),
    `order ${submission.reported.order} reported`,
    ...reportedLines([{ name: 'k', value: submission.reported.k }]),
  ];
}
