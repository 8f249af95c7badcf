import { describe, expect, it } from 'vitest';
import { checkSubmission, parseAssignment } from '../../server/checks/check.ts';

// Invented exact data: three readings that halve (or quarter, or eighth) every minute towards x_inf = 0,
// so ln F lies exactly on a line through the origin, every run's k_obs has standard error 0, and weights
// 1/SE^2 cannot be formed. k_obs = ln 2, ln 4, ln 8 per minute at 0.1, 0.2, 0.3 M: k_N = 0 and
// k_A = ln 2 / 0.1 M = 6.931 M^-1 min^-1 (ln 2 = 0.6931, a mathematical constant).
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rateLawFit: 'weighted' });

function run(label: string, acid: number, ratio: number) {
  const k = -Math.log(ratio);
  return {
    label,
    catalyst: { value: acid, unit: 'M' },
    timeUnit: 'min',
    readings: [0, 1, 2].map((t) => [t, 16 * ratio ** t]),
    infinity: 0,
    reported: { k: { value: k, uncertainty: 0, unit: 'min^-1' } },
  };
}

const submission = (kN: number, kA: number) => ({
  studentId: 'W-01',
  runs: [run('A', 0.1, 1 / 2), run('B', 0.2, 1 / 4), run('C', 0.3, 1 / 8)],
  reported: { kN: { value: kN, uncertainty: 1, unit: 'min^-1' }, kA: { value: kA, uncertainty: 1, unit: 'M^-1 min^-1' } },
});

describe('the weighted rate law when a run has no scatter', () => {
  it('is refitted unweighted, says so, and still checks k_N and k_A: 99 and -5 do not score', () => {
    const result = checkSubmission(assignment, submission(99, -5));
    expect(result.findings).toContainEqual(expect.objectContaining({ code: 'refit-note', severity: 'info', path: 'reported', pointsLost: 0 }));
    expect(result.findings.find((f) => f.code === 'refit-note')!.message).toContain('run "A" is 0');
    for (const path of ['reported.kN', 'reported.kA']) {
      expect(result.findings.find((f) => f.path === path)).toMatchObject({ severity: 'error' });
    }
    const refit = result.refit as { kA: { value: number } };
    expect(refit.kA.value).toBeCloseTo(Math.LN2 / 0.1, 9);
    expect(result.score!).toBeLessThanOrEqual(result.maxScore - 4);
  });
});
