import { EngineError, requireFinite } from './engine-error.ts';
import { tCritical95 } from './student-t.ts';

/**
 * Straight-line least squares, y = a + b x, and the line through the origin, y = b x, ordinary or
 * weighted (weights 1/sigma^2). Sums are taken about the (weighted) means, with a correction pass on
 * the means, so that badly centred data (all x near 1000, say) keep their digits; the normal
 * equations in raw sums would lose about half of them.
 */
export type LineModel = 'intercept' | 'origin';

export interface LineFitOptions {
  /** Standard deviation of each y: fit with weights 1/sigma^2. */
  sigma?: ArrayLike<number>;
  /**
   * With sigma given: scale the covariance by the reduced chi-squared (sigma known only up to a
   * common factor) instead of taking sigma as absolute. Ignored for an unweighted fit, which always
   * estimates the scale from the residuals.
   */
  scaleByResidual?: boolean;
}

export interface LineFit {
  model: LineModel;
  n: number;
  /** Residual degrees of freedom: n - 2 with an intercept, n - 1 through the origin. */
  dof: number;
  intercept: number;
  slope: number;
  /** Zero for the origin model, whose intercept is fixed. */
  seIntercept: number;
  seSlope: number;
  covInterceptSlope: number;
  /** sqrt(SSE / dof), with SSE weighted for a weighted fit. */
  residualSD: number;
  /** Centred 1 - SSE/Syy with an intercept; uncentred 1 - SSE/sum(y^2) through the origin. */
  rSquared: number;
  /** SSE / dof of a weighted fit (the reduced chi-squared); 1 is the expectation when sigma is right. */
  reducedChiSquared: number;
  weighted: boolean;
  ci95: { intercept: [number, number]; slope: [number, number] };
  residuals: number[];
}

export const MIN_POINTS = 3;

function checkInput(x: ArrayLike<number>, y: ArrayLike<number>, sigma: ArrayLike<number> | undefined): void {
  if (x.length !== y.length) {
    throw new EngineError('too-few-points', `x has ${x.length} values but y has ${y.length}`, 'y');
  }
  if (x.length < MIN_POINTS) {
    throw new EngineError('too-few-points', `a fit needs at least ${MIN_POINTS} points, got ${x.length}`, 'x');
  }
  requireFinite(x, 'x');
  requireFinite(y, 'y');
  if (sigma) {
    if (sigma.length !== x.length) {
      throw new EngineError('bad-weight', `sigma has ${sigma.length} values for ${x.length} points`, 'sigma');
    }
    for (let i = 0; i < sigma.length; i++) {
      if (!(sigma[i] > 0) || !Number.isFinite(sigma[i])) {
        throw new EngineError('bad-weight', `sigma[${i}] is ${String(sigma[i])}; it must be a positive number`, `sigma[${i}]`);
      }
    }
  }
}

/** Weights 1/sigma^2, or undefined for an ordinary fit (every weight 1, no array needed). */
type Weights = Float64Array | undefined;

function weightsOf(sigma: ArrayLike<number> | undefined): Weights {
  if (!sigma) return undefined;
  const w = new Float64Array(sigma.length);
  for (let i = 0; i < sigma.length; i++) w[i] = 1 / (sigma[i] * sigma[i]);
  return w;
}

function weightedMean(v: ArrayLike<number>, n: number, w: Weights, sumW: number): number {
  let m = 0;
  for (let i = 0; i < n; i++) m += (w ? w[i] : 1) * v[i];
  m /= sumW;
  // One correction pass: the mean of the deviations from the first estimate restores the digits
  // lost when the values share a large common part.
  let c = 0;
  for (let i = 0; i < n; i++) c += (w ? w[i] : 1) * (v[i] - m);
  return m + c / sumW;
}

function interval(value: number, se: number, t: number): [number, number] {
  return [value - t * se, value + t * se];
}

/** The sums a fit is read from; for the origin model the means are zero and sumW is unused. */
interface LineSums {
  sumW: number;
  xm: number;
  ym: number;
  sxx: number;
  syy: number;
  slope: number;
  sse: number;
}

/**
 * The first n points' fit with an intercept, without allocating (slip searches run thousands); the
 * residuals are written into `residuals` where the caller wants them.
 */
function interceptSums(x: ArrayLike<number>, y: ArrayLike<number>, n: number, w: Weights, residuals?: number[]): LineSums {
  let sumW = n;
  if (w) {
    sumW = 0;
    for (let i = 0; i < n; i++) sumW += w[i];
  }
  const xm = weightedMean(x, n, w, sumW);
  const ym = weightedMean(y, n, w, sumW);
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - xm;
    const dy = y[i] - ym;
    const wi = w ? w[i] : 1;
    sxx += wi * dx * dx;
    sxy += wi * dx * dy;
    syy += wi * dy * dy;
  }
  if (!(sxx > 0)) {
    throw new EngineError('degenerate-x', 'all x values are equal, so no slope can be fitted', 'x');
  }
  const slope = sxy / sxx;
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - ym - slope * (x[i] - xm);
    if (residuals) residuals[i] = r;
    sse += (w ? w[i] : 1) * r * r;
  }
  return { sumW, xm, ym, sxx, syy, slope, sse };
}

function originSums(x: ArrayLike<number>, y: ArrayLike<number>, n: number, w: Weights, residuals?: number[]): LineSums {
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const wi = w ? w[i] : 1;
    sxx += wi * x[i] * x[i];
    sxy += wi * x[i] * y[i];
    syy += wi * y[i] * y[i];
  }
  if (!(sxx > 0)) {
    throw new EngineError('degenerate-x', 'all x values are zero, so no slope through the origin can be fitted', 'x');
  }
  const slope = sxy / sxx;
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - slope * x[i];
    if (residuals) residuals[i] = r;
    sse += (w ? w[i] : 1) * r * r;
  }
  return { sumW: n, xm: 0, ym: 0, sxx, syy, slope, sse };
}

const dofOf = (model: LineModel, n: number) => (model === 'origin' ? n - 1 : n - 2);

export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>, options: LineFitOptions = {}): LineFit {
  const { sigma } = options;
  checkInput(x, y, sigma);
  const n = x.length;
  const w = weightsOf(sigma);
  const residuals = new Array<number>(n);
  const { sumW, xm, ym, sxx, syy, slope, sse } = interceptSums(x, y, n, w, residuals);
  const intercept = ym - slope * xm;
  const dof = dofOf('intercept', n);
  const reducedChiSquared = sse / dof;
  const weighted = sigma !== undefined;
  const scale = weighted && !options.scaleByResidual ? 1 : reducedChiSquared;
  const varSlope = scale / sxx;
  const varIntercept = scale * (1 / sumW + (xm * xm) / sxx);
  const seSlope = Math.sqrt(varSlope);
  const seIntercept = Math.sqrt(varIntercept);
  const t = tCritical95(dof);
  return {
    model: 'intercept',
    n,
    dof,
    intercept,
    slope,
    seIntercept,
    seSlope,
    covInterceptSlope: -xm * varSlope,
    residualSD: Math.sqrt(reducedChiSquared),
    rSquared: syy > 0 ? 1 - sse / syy : 1,
    reducedChiSquared,
    weighted,
    ci95: { intercept: interval(intercept, seIntercept, t), slope: interval(slope, seSlope, t) },
    residuals,
  };
}

export function fitThroughOrigin(x: ArrayLike<number>, y: ArrayLike<number>, options: LineFitOptions = {}): LineFit {
  const { sigma } = options;
  checkInput(x, y, sigma);
  const n = x.length;
  const w = weightsOf(sigma);
  const residuals = new Array<number>(n);
  const { sxx, syy, slope, sse } = originSums(x, y, n, w, residuals);
  const dof = dofOf('origin', n);
  const reducedChiSquared = sse / dof;
  const weighted = sigma !== undefined;
  const scale = weighted && !options.scaleByResidual ? 1 : reducedChiSquared;
  const seSlope = Math.sqrt(scale / sxx);
  const t = tCritical95(dof);
  return {
    model: 'origin',
    n,
    dof,
    intercept: 0,
    slope,
    seSlope,
    seIntercept: 0,
    covInterceptSlope: 0,
    residualSD: Math.sqrt(reducedChiSquared),
    rSquared: syy > 0 ? 1 - sse / syy : 1,
    reducedChiSquared,
    weighted,
    ci95: { intercept: [0, 0], slope: interval(slope, seSlope, t) },
    residuals,
  };
}

/**
 * The ordinary fit's slope and its standard error alone, from the first `n` points of x and y (finite,
 * as the caller guarantees): the same numbers as the full fit, for searches that try many data sets.
 */
export function slopeOnly(model: LineModel, x: ArrayLike<number>, y: ArrayLike<number>, n: number): { slope: number; seSlope: number } {
  if (n < MIN_POINTS) {
    throw new EngineError('too-few-points', `a fit needs at least ${MIN_POINTS} points, got ${n}`, 'x');
  }
  const { sxx, slope, sse } = model === 'origin' ? originSums(x, y, n, undefined) : interceptSums(x, y, n, undefined);
  return { slope, seSlope: Math.sqrt(sse / dofOf(model, n) / sxx) };
}

export function fitLineModel(model: LineModel, x: ArrayLike<number>, y: ArrayLike<number>, options?: LineFitOptions): LineFit {
  return model === 'origin' ? fitThroughOrigin(x, y, options) : fitLine(x, y, options);
}
