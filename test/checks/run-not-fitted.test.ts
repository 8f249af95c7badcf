import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * Invented, noise-free runs: x(t) = x_inf + (x_0 - x_inf) e^(-k t) with x_0 = 20, x_inf = 5, a reading
 * a minute for 10 minutes, and k_obs = k_N + k_A c with k_N = 0.01 min^-1 and k_A = 0.1 M^-1 min^-1
 * (so 0.02, 0.03, 0.04, 0.05 min^-1 at 0.1 to 0.4 M). A readings line is exact, so the refit gives
 * these k's, and the rate law k_N and k_A, to rounding error (first-order kinetics: textbook relation).
 * Only k (2 per run), k_N (2) and k_A (2) are graded here: the rubric's other items are set to 0.
 */
const kN = 0.01;
const kA = 0.1;
const curve = (k: number, minutes: number[]) => minutes.map((t): [number, number] => [t, 5 + 15 * Math.exp(-k * t)]);
const everyMinute = Array.from({ length: 11 }, (_, t) => t);
const run = (label: string, c: number, readings: Array<[number, number]>, infinity: number | undefined, k: number) => ({
  label,
  catalyst: { value: c, unit: 'M' },
  timeUnit: 'min',
  readings,
  ...(infinity === undefined ? {} : { infinity }),
  reported: { k: { value: Number(k.toPrecision(3)), unit: 'min^-1' } },
});
const goodRuns = [0.1, 0.2, 0.3, 0.4].map((c, i) => run(`R${i + 1}`, c, curve(kN + kA * c, everyMinute), 5, kN + kA * c));
// Three readings and no x_inf: the exponential fit would have to find x_0, x_inf and k from three numbers.
const shortRun = run('R5', 0.25, curve(kN + kA * 0.25, [0, 5, 10]), undefined, kN + kA * 0.25);
const rubric = { readings: 0, lnF: 0, kUncertainty: 0, kNUncertainty: 0, kAUncertainty: 0, sigFigs: 0, k: 2, kN: 2, kA: 2 };
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric });
const reported = { kN: { value: kN, unit: 'min^-1' }, kA: { value: kA, unit: 'M^-1 min^-1' } };

describe('a run that cannot be fitted', () => {
  it('three readings without x_inf: a finding on that run, the other four runs and the rate law graded', () => {
    const result = checkSubmission(assignment, { studentId: 'F-01', runs: [...goodRuns, shortRun], reported });
    expect(result.status).toBe('checked');
    const onRun = result.findings.filter((f) => f.path.startsWith('runs[4]'));
    expect(onRun).toEqual([expect.objectContaining({ code: 'run-not-fitted', path: 'runs[4].readings', severity: 'warning', pointsLost: 0 })]);
    expect(onRun[0].message).toContain('needs at least 4 readings');
    // Hand verdict: k of four runs (4 x 2) + k_N 2 + k_A 2 = 12 of 12; the short run's k leaves the maximum.
    expect(result.maxScore).toBe(12);
    expect(result.score).toBe(12);
    expect(result.findings.filter((f) => f.pointsLost > 0)).toEqual([]);
    const refit = result.refit as { runs: Array<{ notFitted?: string }>; kN: { value: number }; kA: { value: number } };
    expect(refit.runs[4].notFitted).toContain('no x_inf');
    expect(refit.kN.value).toBeCloseTo(kN, 9);
    expect(refit.kA.value).toBeCloseTo(kA, 9);
  });

  it('a wrong k_A is still charged when one run cannot be fitted', () => {
    const result = checkSubmission(assignment, { studentId: 'F-02', runs: [...goodRuns, shortRun], reported: { ...reported, kA: { value: 0.2, unit: 'M^-1 min^-1' } } });
    expect(result.findings.filter((f) => f.pointsLost > 0).map((f) => f.path)).toEqual(['reported.kA']);
    expect(result.score).toBe(10);
  });

  it('readings that do not change: a finding on that run, not a refusal', () => {
    const flat = { ...goodRuns[3], readings: everyMinute.map((t): [number, number] => [t, 12.5]) };
    const result = checkSubmission(assignment, { studentId: 'F-03', runs: [...goodRuns.slice(0, 3), flat, shortRun], reported });
    expect(result.status).toBe('checked');
    expect(result.findings.filter((f) => f.code === 'run-not-fitted').map((f) => f.path)).toEqual(['runs[3].readings', 'runs[4].readings']);
  });

  it('with fewer than three fitted runs left, the rate law is left out of the maximum and a note says why', () => {
    const result = checkSubmission(assignment, { studentId: 'F-04', runs: [goodRuns[0], goodRuns[1], shortRun], reported });
    expect(result.status).toBe('checked');
    // Hand verdict: k of two runs (2 x 2) = 4 of 4.
    expect(result.maxScore).toBe(4);
    expect(result.score).toBe(4);
    expect(result.findings.find((f) => f.code === 'refit-note')?.message).toContain('fewer than three runs');
  });

  it('a unit that cannot be read is still refused, naming the field', () => {
    const result = checkSubmission(assignment, { studentId: 'F-05', runs: [{ ...goodRuns[0], timeUnit: 'fortnights' }, ...goodRuns.slice(1)], reported });
    expect(result.status).toBe('rejected');
    expect(result.rejected?.[0]?.path).toBe('runs[0].timeUnit');
  });
});

describe('a submission with no run that can be fitted', () => {
  it('is refused, naming each run and why: nothing in it can be graded', () => {
    const result = checkSubmission(assignment, { studentId: 'F-06', runs: [shortRun], reported });
    expect(result.status).toBe('rejected');
    expect(result.rejected).toEqual([expect.objectContaining({ path: 'runs[0].readings', message: expect.stringContaining('run "R5" cannot be fitted') })]);
  });
});
