import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import type { Settings, Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { feedbackInput } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// Invented data. The result goes through JSON as when stored: a standard error that is not defined
// (NaN) arrives as null.
const stored = <T>(value: T): T => JSON.parse(JSON.stringify(value)) as T;

async function sheetText(settings: unknown, submission: unknown): Promise<string> {
  const assignment = parseAssignment(settings);
  const result = stored(checkSubmission(assignment, submission));
  const input = feedbackInput(assignment.settings as Settings, { submission: submission as Submission, result });
  return folded(await pdfText(await feedbackSheet(input)));
}

describe('sheets for work with parts that cannot be graded', () => {
  it('a run that cannot be fitted: its row says "not fitted", the finding says why, the sheet still draws', async () => {
    const curve = (k: number, times: number[]) => times.map((t): [number, number] => [t, 5 + 15 * Math.exp(-k * t)]);
    const minutes = Array.from({ length: 11 }, (_, t) => t);
    const runs = [0.1, 0.2, 0.3].map((c, i) => ({ label: `R${i + 1}`, catalyst: { value: c, unit: 'M' }, timeUnit: 'min', readings: curve(0.01 + 0.1 * c, minutes), infinity: 5, reported: { k: { value: 0.01 + 0.1 * c, unit: 'min^-1' } } }));
    const short = { label: 'R4', catalyst: { value: 0.4, unit: 'M' }, timeUnit: 'min', readings: curve(0.05, [0, 5, 10]), reported: { k: { value: 0.05, unit: 'min^-1' } } };
    const text = await sheetText({ kind: 'first-order-catalysis', fitModel: 'origin' }, { studentId: 'F-SHEET', runs: [...runs, short] });
    expect(text).toContain('not fitted');
    expect(text).toContain(folded('cannot be fitted'));
  });

  it('two temperatures: the refit column says the SE is not defined', async () => {
    const points = [
      { label: 'low', temperature: { value: 298.15, unit: 'K' }, k: { value: 1e-3, unit: 's^-1' } },
      { label: 'high', temperature: { value: 308.15, unit: 'K' }, k: { value: 2.7e-3, unit: 's^-1' } },
    ];
    const text = await sheetText({ kind: 'temperature-dependence' }, { studentId: 'T-SHEET', points });
    expect(text).toContain(folded('SE not defined with two points'));
  });
});
