import { describe, expect, it } from 'vitest';
import { checkSubmission, parseAssignment } from '../../server/checks/check.ts';

// Published worked example (a textbook-style problem on a public chemistry question-and-answer site, as
// recorded in test/reference/kinetics-check-values.md): sucrose inversion in 0.5 M HCl at 35 C, rotation
// +32.4, +28.8, +25.5, +22.4, +19.6 deg at t = 0, 10, 20, 30, 40 min. The Guggenheim method with
// D = 10 min gives k = 8.16e-3 min^-1 there [derived in that file]; here x_inf is taken as not measured.
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin' });

const submission = (k: number) => ({
  studentId: 'G-01',
  runs: [
    {
      label: 'sucrose',
      catalyst: { value: 0.5, unit: 'M' },
      timeUnit: 'min',
      readings: [[0, 32.4], [10, 28.8], [20, 25.5], [30, 22.4], [40, 19.6]],
      reported: { k: { value: k, uncertainty: 0.0003, unit: 'min^-1' } },
    },
  ],
});

describe('a run without x_inf, analysed by a method of the trade other than ours', () => {
  it('Guggenheim with D = 10 min (k = 8.16e-3 min^-1) is right: it lies within our fit\'s 95 % interval', () => {
    const result = checkSubmission(assignment, submission(8.16e-3));
    expect(result.status).toBe('checked');
    expect(result.findings.filter((f) => f.path === 'runs[0].reported.k' && f.severity === 'error')).toEqual([]);
  });

  it('a value outside what the readings allow is still an error', () => {
    const result = checkSubmission(assignment, submission(1.6e-2));
    expect(result.findings.find((f) => f.path === 'runs[0].reported.k')).toMatchObject({ severity: 'error' });
  });
});
