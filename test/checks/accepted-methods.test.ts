import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

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

describe('the standard error of a Guggenheim fit, beside its k', () => {
  // The same readings, no x_inf. The line ln|r_t - r_(t+D)| on t, worked here by closed-form least squares:
  // slope = Sxy / Sxx, SE = sqrt(SSE / (m - 2) / Sxx) over the m pairs (common practice, no source).
  const r = [32.4, 28.8, 25.5, 22.4, 19.6];
  const guggenheim = (step: number) => {
    const t = r.slice(0, r.length - step).map((_, i) => 10 * i);
    const y = t.map((_, i) => Math.log(r[i] - r[i + step]));
    const mt = t.reduce((s, v) => s + v, 0) / t.length;
    const my = y.reduce((s, v) => s + v, 0) / y.length;
    const sxx = t.reduce((s, v) => s + (v - mt) ** 2, 0);
    const slope = t.reduce((s, v, i) => s + (v - mt) * (y[i] - my), 0) / sxx;
    const sse = y.reduce((s, v, i) => s + (v - my - slope * (t[i] - mt)) ** 2, 0);
    return { k: -slope, se: Math.sqrt(sse / (t.length - 2) / sxx) };
  };
  const d10 = guggenheim(1);
  const d20 = guggenheim(2);
  const withKAndSE = (k: number, se: number) =>
    checkSubmission(assignment, {
      studentId: 'G-02',
      runs: [{ label: 'sucrose', catalyst: { value: 0.5, unit: 'M' }, timeUnit: 'min', readings: r.map((x, i) => [10 * i, x]), reported: { k: { value: k.toPrecision(3), uncertainty: se.toPrecision(2), unit: 'min^-1' } } }],
    }).findings.filter((f) => f.path.startsWith('runs[0].reported.k') && f.severity === 'error');

  it('is right at D = 10 min: k 8.16e-3 with the SE of its own slope, 5.1e-4 (the exponential fit\'s is 3.2e-4)', () => {
    expect(d10.k.toPrecision(3)).toBe('0.00816');
    expect(d10.se.toPrecision(2)).toBe('0.00051');
    expect(withKAndSE(d10.k, d10.se)).toEqual([]);
    // And at D = 20 min, the interval that pairs the first half with the second: 7.83e-3 with its own SE.
    expect(withKAndSE(d20.k, d20.se)).toEqual([]);
  });

  it('but not the SE of one interval beside the k of another, nor an SE no fit gives', () => {
    // D = 20's SE (1.8e-4) is far from D = 10's (5.1e-4) and from the exponential fit's (3.2e-4).
    expect(Math.abs(d20.se / d10.se - 1)).toBeGreaterThan(0.5);
    expect(withKAndSE(d10.k, d20.se).map((f) => f.path)).toEqual(['runs[0].reported.k.uncertainty']);
    expect(withKAndSE(d10.k, 0.0009).map((f) => f.path)).toEqual(['runs[0].reported.k.uncertainty']);
  });
});

describe('the standard error of the line through the origin, in both conventions in use', () => {
  // Invented run: x = 2 + 10 e^(-0.1 t) at t = 0..5 min with a little scatter, x_inf = 2. The line through
  // the origin is fitted to every (t, ln F), (0, 0) among them. Common spreadsheet functions (LINEST with
  // the constant set to zero) count that point among the n - 1 degrees of freedom; counting it out
  // leaves n - 2 (common practice, no source). Both SEs are worked here in closed form.
  const scatter = [0, 0.004, -0.003, 0.005, -0.002, 0.001];
  const readings = scatter.map((d, t): [number, number] => [t, Number((2 + 10 * Math.exp(-0.1 * t) + d).toFixed(3))]);
  const t = readings.map(([time]) => time);
  const y = readings.map(([, x]) => Math.log((x - 2) / (readings[0][1] - 2)));
  const stt = t.reduce((s, ti) => s + ti * ti, 0);
  const slope = t.reduce((s, ti, i) => s + ti * y[i], 0) / stt;
  const sse = t.reduce((s, ti, i) => s + (y[i] - slope * ti) ** 2, 0);
  const seWith = (dof: number) => Math.sqrt(sse / dof / stt);
  // A narrow band for the SE (1 %), so that only the conventions themselves are right, each to 2 figures.
  const strict = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', tolerances: { kUncertainty: { relative: 0.01 } } });
  const withSE = (se: number) =>
    checkSubmission(strict, {
      studentId: 'O-01',
      runs: [{ label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings, infinity: 2, reported: { k: { value: Number((-slope).toFixed(4)), uncertainty: Number(se.toPrecision(2)), unit: 'min^-1' } } }],
    }).findings.filter((f) => f.path === 'runs[0].reported.k.uncertainty');

  it('is right with the point at t = 0 counted (n - 1 = 5 degrees of freedom) or not (n - 2 = 4)', () => {
    // The two differ by sqrt(5/4) = 1.118, beyond both the band and the rounding to 2 figures.
    expect(Math.abs(seWith(4) / seWith(5) - 1)).toBeGreaterThan(0.1);
    expect(withSE(seWith(5))).toEqual([]);
    expect(withSE(seWith(4))).toEqual([]);
  });

  it('but not with some other count (n - 3 = 3)', () => {
    expect(withSE(seWith(3))).toEqual([expect.objectContaining({ severity: 'error' })]);
  });
});
