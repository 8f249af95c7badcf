import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * Two temperatures (invented): k = 1.00e-3 s^-1 at 298.15 K and 2.70e-3 s^-1 at 308.15 K. A line
 * through two points is exact, so E_a, A, ΔH‡ and ΔS‡ follow by hand (the two-point Arrhenius and
 * Eyring relations, textbook algebra of ln k = ln A - E_a/(R T) and
 * ln(k/T) = ln(k_B/h) + ΔS‡/R - ΔH‡/(R T)); their standard errors are not defined (n - 2 = 0 degrees
 * of freedom: common practice, no source).
 */
const R = 8.314462618; // J K^-1 mol^-1 = N_A k_B, exact in the SI since 2019
const LN_KB_OVER_H = Math.log(1.380649e-23 / 6.62607015e-34); // k_B and h exact in the SI since 2019
const [T1, T2] = [298.15, 308.15];
const [k1, k2] = [1.0e-3, 2.7e-3];
const reciprocalGap = 1 / T1 - 1 / T2;
const Ea = (R * Math.log(k2 / k1)) / reciprocalGap; // J mol^-1
const A = k1 * Math.exp(Ea / (R * T1)); // s^-1
const dH = (R * Math.log(k2 / T2 / (k1 / T1))) / reciprocalGap; // J mol^-1
const dS = R * (Math.log(k1 / T1) + dH / (R * T1) - LN_KB_OVER_H); // J K^-1 mol^-1

const assignment = parseAssignment({ kind: 'temperature-dependence' });
const points = [
  { label: 'low', temperature: { value: T1, unit: 'K' }, k: { value: k1, unit: 's^-1' } },
  { label: 'high', temperature: { value: 35, unit: 'degC' }, k: { value: k2, unit: 's^-1' } },
];
const reportedRight = (eaUncertainty?: number) => ({
  Ea: { value: (Ea / 1000).toPrecision(4), ...(eaUncertainty === undefined ? {} : { uncertainty: eaUncertainty }), unit: 'kJ mol^-1' },
  A: { value: A.toPrecision(3), unit: 's^-1' },
  dH: { value: (dH / 1000).toPrecision(4), unit: 'kJ mol^-1' },
  dS: { value: dS.toPrecision(4), unit: 'J K^-1 mol^-1' },
});

describe('two temperatures: values graded, standard errors not defined', () => {
  it('the hand values themselves: E_a about 75.8 kJ/mol for k rising 2.7 times over 10 K near room temperature (from memory: the rule that k doubles to triples per 10 K)', () => {
    expect(Ea / 1000).toBeGreaterThan(70);
    expect(Ea / 1000).toBeLessThan(80);
    // ΔH‡ = E_a - R T over this interval, exactly the mean-value form for two points: E_a - ΔH‡ = R ln(T2/T1)/(1/T1 - 1/T2).
    expect(Ea - dH).toBeCloseTo((R * Math.log(T2 / T1)) / reciprocalGap, 6);
  });

  it('correct values: no points lost, one note that the SEs are not defined, the SE of E_a left out of the maximum', () => {
    const result = checkSubmission(assignment, { studentId: 'T-2P', points, reported: reportedRight() });
    expect(result.status).toBe('checked');
    const refit = result.refit as Record<'Ea' | 'A' | 'dH' | 'dS', { value: number; standardError: number }>;
    expect(refit.Ea.value / (Ea / 1000)).toBeCloseTo(1, 9);
    expect(refit.A.value / A).toBeCloseTo(1, 9);
    expect(refit.dH.value / (dH / 1000)).toBeCloseTo(1, 9);
    expect(refit.dS.value).toBeCloseTo(dS, 6);
    expect(Number.isNaN(refit.Ea.standardError)).toBe(true);
    // Hand verdict: rubric E_a 2 + A 1 + ΔH‡ 2 + ΔS‡ 2 = 7 (the SE of E_a, 1, is not graded); nothing charged.
    expect(result.maxScore).toBe(7);
    expect(result.score).toBe(7);
    expect(result.findings).toEqual([expect.objectContaining({ code: 'uncertainty-undefined', severity: 'info', pointsLost: 0, path: 'points' })]);
    expect(result.findings[0].message).toContain('not defined with two points');
  });

  it('an SE the student reports anyway is named as not defined, and costs nothing', () => {
    const result = checkSubmission(assignment, { studentId: 'T-2P', points, reported: reportedRight(0) });
    expect(result.score).toBe(7);
    expect(result.findings.map((f) => f.code)).toEqual(['uncertainty-undefined']);
    expect(result.findings[0].message).toContain('The standard error you give for E_a (± 0) is not defined with two points');
  });

  it('a wrong value is still charged: E_a in J written as kJ (x1000), the rubric item E_a (2 points)', () => {
    const reported = { ...reportedRight(), Ea: { value: Ea.toPrecision(4), unit: 'kJ mol^-1' } };
    const result = checkSubmission(assignment, { studentId: 'T-2P', points, reported });
    expect(result.findings.filter((f) => f.pointsLost > 0).map((f) => `${f.code}@${f.path}:${f.pointsLost}`)).toEqual(['energy-unit@reported.Ea:2']);
    expect(result.score).toBe(5);
  });

  it('one temperature is still refused, naming the field', () => {
    const result = checkSubmission(assignment, { studentId: 'T-1P', points: points.slice(0, 1), reported: reportedRight() });
    expect(result.status).toBe('rejected');
    expect(result.rejected?.[0]?.path).toBe('points');
  });
});

describe('a point given as a run that cannot be fitted', () => {
  // A third point at 318.15 K given as a run of three readings without x_inf (invented): the exponential
  // fit would have to find x_0, x_inf and k from three numbers. The student reports k = 4.5e-3 s^-1 for
  // it and fits all three of their k by least squares (textbook formulas below).
  const T3 = 318.15;
  const k3 = 4.5e-3; // well off the line through the other two (which gives about 6.8e-3 there)
  const run = { timeUnit: 's', readings: [[0, 10], [100, 7.2], [200, 5.6]], reported: { k: { value: k3, unit: 's^-1' } } };
  const x = [T1, T2, T3].map((t) => 1 / t);
  const line = (y: number[]) => {
    const mx = x.reduce((a, b) => a + b, 0) / 3;
    const my = y.reduce((a, b) => a + b, 0) / 3;
    const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
    return { slope, intercept: my - slope * mx };
  };
  const ks3 = [k1, k2, k3];
  const arr = line(ks3.map(Math.log));
  const eyr = line(ks3.map((k, i) => Math.log(k / [T1, T2, T3][i])));
  const theirs = { Ea: -R * arr.slope, A: Math.exp(arr.intercept), dH: -R * eyr.slope, dS: R * (eyr.intercept - LN_KB_OVER_H) };

  it('is named on its readings and left out of our fit; values from the student\'s own three k are carried forward, not charged', () => {
    const reported = {
      Ea: { value: (theirs.Ea / 1000).toPrecision(4), unit: 'kJ mol^-1' },
      A: { value: theirs.A.toPrecision(3), unit: 's^-1' },
      dH: { value: (theirs.dH / 1000).toPrecision(4), unit: 'kJ mol^-1' },
      dS: { value: theirs.dS.toPrecision(4), unit: 'J K^-1 mol^-1' },
    };
    const result = checkSubmission(assignment, { studentId: 'T-3R', points: [...points, { label: 'run', temperature: { value: T3, unit: 'K' }, run }], reported });
    expect(result.status).toBe('checked');
    expect(result.findings.filter((f) => f.code === 'run-not-fitted')).toEqual([expect.objectContaining({ path: 'points[2].run.readings', severity: 'warning', pointsLost: 0 })]);
    // Our line is the two measured points' (see above): E_a as worked by hand there.
    expect((result.refit as { Ea: { value: number } }).Ea.value / (Ea / 1000)).toBeCloseTo(1, 9);
    // Hand verdict: E_a 2 + A 1 + ΔH‡ 2 + ΔS‡ 2 = 7 (the run's k and the SE of E_a are not graded), none lost.
    expect(result.maxScore).toBe(7);
    expect(result.score).toBe(7);
    expect(result.findings.filter((f) => f.code === 'carried-forward').map((f) => f.path)).toEqual(['reported.Ea', 'reported.A', 'reported.dH', 'reported.dS']);
  });
});

describe('fewer than two points with a rate constant', () => {
  it('is refused, naming the run that gave none and the points', () => {
    const run = { timeUnit: 's', readings: [[0, 10], [100, 7.2], [200, 5.6]] };
    const result = checkSubmission(assignment, { studentId: 'T-1R', points: [points[0], { label: 'run', temperature: { value: 318.15, unit: 'K' }, run }], reported: reportedRight() });
    expect(result.status).toBe('rejected');
    expect(result.rejected?.map((r) => r.path)).toEqual(['points[1].run.readings', 'points']);
  });
});
