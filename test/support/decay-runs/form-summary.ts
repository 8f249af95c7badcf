import { perUnitLine, readingsLine } from '../../../server/checks/form-lines.ts';
import type { Submission } from './schemas.ts';

/** What a decay-runs submission's form holds: its runs and readings; every run carries its k, as the schema asks. */
export function decayFormSummary(submission: Submission): string[] {
  return [readingsLine(submission.runs.map((r) => r.readings.length)), perUnitLine('k', submission.runs.map(() => true))];
}
