import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

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

describe('the weighted rate law when the k_obs scatter beyond their standard errors', () => {
  // Invented runs: x(t) = 5 + 15 e^(-k t) to 0.001 deg with a fixed small scatter, a minute apart,
  // k_obs off a straight line in [H+] by a few per cent, so the reduced chi-square is far above 1.
  const scatter = [0, 2, -1, 3, -2, 1, 0, -3, 2, -1, 1, 0, -2, 3, -1, 0].map((d) => d / 1000);
  const runAt = (label: string, acid: number, k: number) => ({
    label,
    catalyst: { value: acid, unit: 'M' },
    timeUnit: 'min',
    readings: scatter.map((d, t) => [t, Number((5 + 15 * Math.exp(-k * t) + d).toFixed(3))]),
    infinity: 5,
  });
  const runs = [runAt('A', 0.05, 0.031), runAt('B', 0.1, 0.0395), runAt('C', 0.15, 0.052), runAt('D', 0.2, 0.0585)];
  const check = (weightedErrors: string, kASE?: number) => {
    const settings = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rateLawFit: 'weighted', weightedErrors });
    const first = checkSubmission(settings, { studentId: 'W-02', runs });
    const refit = first.refit as { kA: { value: number; standardError: number }; weightedFit: { reducedChiSquared: number; convention: string; otherConvention: { kA: number } } };
    const reported = { kA: { value: refit.kA.value, uncertainty: Number((kASE ?? refit.kA.standardError).toPrecision(2)), unit: 'M^-1 min^-1' } };
    return { refit, result: checkSubmission(settings, { studentId: 'W-02', runs, reported }) };
  };

  it('says which convention it used and by how much they differ; either is right by default', () => {
    const { refit } = check('either');
    expect(refit.weightedFit.convention).toBe('absolute');
    expect(refit.weightedFit.reducedChiSquared).toBeGreaterThan(4);
    // The scaled SE is the absolute one times sqrt(reduced chi-square), by definition.
    expect(refit.weightedFit.otherConvention.kA / refit.kA.standardError).toBeCloseTo(Math.sqrt(refit.weightedFit.reducedChiSquared), 10);
    for (const se of [refit.kA.standardError, refit.weightedFit.otherConvention.kA]) {
      const { result } = check('either', se);
      expect(result.findings.find((f) => f.path === 'reported.kA.uncertainty')).toBeUndefined();
      expect(result.findings.find((f) => f.code === 'refit-note')!.message).toContain('Either convention is accepted.');
    }
  });

  it('holds to the convention the instructor sets, naming the other as the kind of uncertainty', () => {
    const absolute = check('absolute');
    const { result } = check('absolute', absolute.refit.weightedFit.otherConvention.kA);
    expect(result.findings.find((f) => f.path === 'reported.kA.uncertainty')).toMatchObject({ code: 'uncertainty-kind', detail: 'standard error scaled by the scatter about the line' });
    const scaled = check('scaled');
    expect(scaled.refit.weightedFit.convention).toBe('scaled');
    expect(scaled.refit.kA.standardError).toBeCloseTo(absolute.refit.weightedFit.otherConvention.kA, 15);
    expect(check('scaled', scaled.refit.kA.standardError).result.findings.find((f) => f.path === 'reported.kA.uncertainty')).toBeUndefined();
  });
});
