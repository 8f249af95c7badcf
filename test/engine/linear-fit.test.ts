import MLR from 'ml-regression-multivariate-linear';
import { describe, expect, it } from 'vitest';
import { fitLine, fitThroughOrigin } from '../../server/engine/linear-fit.ts';
import { tCritical95 } from '../../server/engine/student-t.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { thrown } from '../support/thrown.ts';

const codeOf = (f: () => unknown) => {
  const e = thrown(f);
  return { code: e.code, field: e.field };
};

const relErr = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe('Student t critical values', () => {
  // Two-sided 95 % points t(0.975, v) to three decimals, as printed in the t tables of statistics
  // texts (the NIST/SEMATECH e-Handbook of Statistical Methods has one); the values are from memory,
  // so they are held to the table's precision only.
  it.each([
    [1, 12.706],
    [2, 4.303],
    [5, 2.571],
    [10, 2.228],
    [14, 2.145],
    [30, 2.042],
    [100, 1.984],
  ])('t(0.975, %i) = %f to the table precision', (dof, table) => {
    expect(Math.abs(tCritical95(dof) - table)).toBeLessThan(0.0006);
  });
});

describe('ordinary least squares against a general-purpose regression library', () => {
  // Reference: the npm package ml-regression-multivariate-linear (mljs), which solves the normal
  // equations by SVD and reports coefficient standard errors from s^2 (X'X)^-1.
  const random = seededRandom(20261202);
  const sets = Array.from({ length: 300 }, () => {
    const n = 4 + Math.floor(random() * 30);
    // Intercepts kept away from zero: a relative difference of a value near zero measures only
    // rounding in the last place, not agreement.
    const a = (random() < 0.5 ? -1 : 1) * (1 + random() * 5);
    const b = (random() - 0.5) * 4;
    const x = Array.from({ length: n }, () => random() * 20);
    const y = x.map((xi) => a + b * xi + (random() - 0.5) * 2);
    return { x, y };
  });

  it('agrees on slope, intercept and their standard errors to 1e-12 relative (300 data sets)', () => {
    let worst = 0;
    for (const { x, y } of sets) {
      const ours = fitLine(x, y);
      const ref = new MLR(x.map((v) => [v]), y.map((v) => [v]), { intercept: true, statistics: true });
      const pairs: Array<[number, number]> = [
        [ours.slope, ref.weights[0][0]],
        [ours.intercept, ref.weights[1][0]],
        [ours.seSlope, ref.stdErrors[0]],
        [ours.seIntercept, ref.stdErrors[1]],
      ];
      for (const [o, r] of pairs) worst = Math.max(worst, relErr(o, r));
    }
    console.log(`largest relative difference from ml-regression-multivariate-linear: ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-12);
  });

  it('agrees through the origin too', () => {
    let worst = 0;
    for (const { x, y } of sets) {
      const ours = fitThroughOrigin(x, y);
      const ref = new MLR(x.map((v) => [v]), y.map((v) => [v]), { intercept: false, statistics: true });
      worst = Math.max(worst, relErr(ours.slope, ref.weights[0][0]), relErr(ours.seSlope, ref.stdErrors[0]));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it('weighted fits equal the ordinary fit of rows scaled by 1/sigma', () => {
    let worst = 0;
    for (const { x, y } of sets.slice(0, 100)) {
      const sigma = x.map(() => 0.2 + random());
      const ours = fitLine(x, y, { sigma, scaleByResidual: true });
      // y/s = a (1/s) + b (x/s): an ordinary fit without intercept on two columns.
      const rows = x.map((xi, i) => [xi / sigma[i], 1 / sigma[i]]);
      const ref = new MLR(rows, y.map((yi, i) => [yi / sigma[i]]), { intercept: false, statistics: true });
      worst = Math.max(
        worst,
        relErr(ours.slope, ref.weights[0][0]),
        relErr(ours.intercept, ref.weights[1][0]),
        relErr(ours.seSlope, ref.stdErrors[0]),
        relErr(ours.seIntercept, ref.stdErrors[1]),
      );
      // With sigma taken as absolute, the covariance is (X'WX)^-1: the scaled SE over sqrt(chi2/dof).
      const absolute = fitLine(x, y, { sigma });
      worst = Math.max(worst, relErr(absolute.seSlope, ours.seSlope / Math.sqrt(ours.reducedChiSquared)));

      const origin = fitThroughOrigin(x, y, { sigma, scaleByResidual: true });
      const refOrigin = new MLR(rows.map((r) => [r[0]]), y.map((yi, i) => [yi / sigma[i]]), { intercept: false });
      worst = Math.max(worst, relErr(origin.slope, refOrigin.weights[0][0]), relErr(origin.seSlope, refOrigin.stdErrors[0]));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it('gives 95 % intervals of estimate +- t(0.975, dof) x SE', () => {
    const { x, y } = sets[0];
    const fit = fitLine(x, y);
    const t = tCritical95(x.length - 2);
    expect(fit.ci95.slope[1] - fit.slope).toBeCloseTo(t * fit.seSlope, 14);
    expect(fit.slope - fit.ci95.slope[0]).toBeCloseTo(t * fit.seSlope, 14);
    expect(fit.ci95.intercept[1] - fit.intercept).toBeCloseTo(t * fit.seIntercept, 14);
  });
});

describe('typed errors', () => {
  it('fewer than 3 points', () => {
    expect(codeOf(() => fitLine([1, 2], [3, 4]))).toEqual({ code: 'too-few-points', field: 'x' });
    expect(codeOf(() => fitThroughOrigin([1, 2], [3, 4]))).toEqual({ code: 'too-few-points', field: 'x' });
  });
  it('all x equal', () => {
    expect(codeOf(() => fitLine([2, 2, 2], [1, 2, 3])).code).toBe('degenerate-x');
    expect(codeOf(() => fitThroughOrigin([0, 0, 0], [1, 2, 3])).code).toBe('degenerate-x');
  });
  it('non-finite input names the element', () => {
    expect(codeOf(() => fitLine([1, 2, 3], [1, Number.NaN, 3]))).toEqual({ code: 'non-finite', field: 'y[1]' });
    expect(codeOf(() => fitLine([1, Infinity, 3], [1, 2, 3]))).toEqual({ code: 'non-finite', field: 'x[1]' });
  });
  it('a sigma that is not positive', () => {
    expect(codeOf(() => fitLine([1, 2, 3], [1, 2, 3], { sigma: [1, 0, 1] }))).toEqual({ code: 'bad-weight', field: 'sigma[1]' });
  });
});
