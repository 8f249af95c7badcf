import { EngineError, requireFinite } from './engine-error.ts';
import type { LineFit } from './linear-fit.ts';

/**
 * The straight line through exactly two points. It fits them exactly, so no scatter is left to
 * estimate its uncertainty from: the standard errors, residual SD and intervals are NaN (not
 * defined), and the residual degrees of freedom are 0. Weights change nothing about such a line.
 */
export function lineThroughTwoPoints(x: ArrayLike<number>, y: ArrayLike<number>): LineFit {
  if (x.length !== 2 || y.length !== 2) throw new EngineError('too-few-points', `a line through two points needs two points, got ${x.length}`, 'x');
  requireFinite(x, 'x');
  requireFinite(y, 'y');
  if (x[0] === x[1]) throw new EngineError('degenerate-x', 'both x values are equal, so no slope can be fitted', 'x');
  const slope = (y[1] - y[0]) / (x[1] - x[0]);
  const intercept = y[0] - slope * x[0];
  const undefinedPair: [number, number] = [Number.NaN, Number.NaN];
  return {
    model: 'intercept',
    n: 2,
    dof: 0,
    intercept,
    slope,
    seIntercept: Number.NaN,
    seSlope: Number.NaN,
    covInterceptSlope: Number.NaN,
    residualSD: Number.NaN,
    rSquared: 1,
    reducedChiSquared: Number.NaN,
    weighted: false,
    ci95: { intercept: undefinedPair, slope: [...undefinedPair] },
    residuals: [0, 0],
  };
}
