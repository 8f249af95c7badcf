import { loadBundled } from './bundled-package.ts';
import { logBeta } from './log-gamma.ts';

/**
 * The Durbin-Watson statistic d = sum (e_i - e_(i-1))^2 / sum e_i^2 of a fit's residuals, and how
 * unlikely so small a d is for independent scatter. Residuals that run in a pattern (drift, a wrong
 * model) sit beside their neighbours and make d small; independent scatter gives d near 2.
 *
 * Under independent normal errors the residuals are e = M eps with M = I - H, H = J (J'J)^-1 J' the
 * fit's hat matrix, and d's mean and variance follow from M and the differencing matrix A:
 *   E d = tr(MA) / (n - p),  Var d = 2 [(n - p) tr((MA)^2) - tr(MA)^2] / [(n - p)^2 (n - p + 2)]
 * (Durbin and Watson's moments, from memory). d / 4 is then taken as a beta variable with these two
 * moments, the usual approximation to d's exact distribution, which gives a lower-tail probability
 * for this fit's own design rather than one table for every run.
 */
export interface DurbinWatson {
  statistic: number;
  expected: number;
  variance: number;
  /** P(d <= statistic) for independent scatter: small when the residuals run in a pattern. */
  pValue: number;
}

let ajBuffer = new Float64Array(3 * 64);

let betaCdf: ((x: number, a: number, b: number) => number) | undefined;

/** The distribution of d for independent scatter about a fit: its mean, variance and lower tail. */
export interface DurbinWatsonNull {
  expected: number;
  variance: number;
  lowerTail(statistic: number): number;
  /**
   * Whether P(d <= statistic) is surely at least `level`, known without the incomplete beta function
   * (which takes a tenth of a second to load and is the costliest step of the test):
   * - for a beta distribution with both parameters above 1 the median lies between the mean and the
   *   mode (a property of the beta distribution, from memory), so a statistic past both has a lower
   *   tail of at least 1/2;
   * - below that, I_x(a, b) = x^a (1 - x)^b / (a B(a, b)) · (1 + (a + b) x / (a + 1) + ...), a series of
   *   positive terms (the incomplete beta function's hypergeometric series, from memory), so its first
   *   two terms are a lower bound.
   */
  tailAtLeast(statistic: number, level: number): boolean;
}

// The bound is computed in logarithms with ln Γ good to about 1e-13: a millionth keeps it a bound.
const BOUND_MARGIN = 1e-6;

/** The lower bound of the beta lower tail I_x(a, b) described at `tailAtLeast`, as a logarithm. */
function logTailBound(x: number, a: number, b: number): number {
  return a * Math.log(x) + b * Math.log1p(-x) - Math.log(a) - logBeta(a, b) + Math.log1p(((a + b) * x) / (a + 1));
}

/**
 * `jacobian` holds the fit's columns (one per parameter, n entries each) and `normalInverse` the
 * row-major (J'J)^-1, as the fit computed them for its standard errors.
 */
export function durbinWatsonNull(jacobian: ArrayLike<number>[], normalInverse: ArrayLike<number>): DurbinWatsonNull {
  const p = jacobian.length;
  const n = jacobian[0].length;
  if (n - p < 2) throw new RangeError('too few residuals for a Durbin-Watson statistic');
  // With H = J C J' (C = (J'J)^-1) of rank p, the traces need only p x p matrices:
  //   tr(MA) = tr(A) - tr(C G),  tr((MA)^2) = tr(A^2) - 2 tr(C K) + tr(C G C G),
  // where G = J'AJ and K = (AJ)'(AJ); A is tridiagonal (1, 2, ..., 2, 1 on the diagonal, -1 beside it).
  // A J, column by column, in one reused buffer: this runs for every run checked.
  if (ajBuffer.length < p * n) ajBuffer = new Float64Array(2 * p * n);
  const aj = ajBuffer;
  for (let c = 0; c < p; c++) {
    const col = jacobian[c];
    for (let i = 0; i < n; i++) aj[c * n + i] = (i === 0 || i === n - 1 ? 1 : 2) * col[i] - (i > 0 ? col[i - 1] : 0) - (i < n - 1 ? col[i + 1] : 0);
  }
  const g = new Array<number>(p * p);
  const k = new Array<number>(p * p);
  for (let r = 0; r < p; r++) {
    const jr = jacobian[r];
    for (let c = 0; c < p; c++) {
      let jAj = 0;
      let ajAj = 0;
      for (let i = 0; i < n; i++) {
        jAj += jr[i] * aj[c * n + i];
        ajAj += aj[r * n + i] * aj[c * n + i];
      }
      g[r * p + c] = jAj;
      k[r * p + c] = ajAj;
    }
  }
  const cg = product(normalInverse, g, p);
  const traceA = 2 * (n - 1);
  const traceA2 = 4 * (n - 2) + 2 + 2 * (n - 1);
  const trace = traceA - traceOf(cg, p);
  const traceSquare = traceA2 - 2 * traceOf(product(normalInverse, k, p), p) + traceOf(product(cg, cg, p), p);
  const f = n - p;
  const expected = trace / f;
  const variance = (2 * (f * traceSquare - trace * trace)) / (f * f * (f + 2));
  const mean = expected / 4;
  const spread = (mean * (1 - mean)) / (variance / 16) - 1;
  const a = mean * spread;
  const b = (1 - mean) * spread;
  const mode = (a - 1) / (a + b - 2);
  return {
    expected,
    variance,
    lowerTail: (statistic) => {
      betaCdf ??= loadBundled<(x: number, a: number, b: number) => number>('beta-cdf', '@stdlib/stats-base-dists-beta-cdf');
      return betaCdf(statistic / 4, a, b);
    },
    tailAtLeast: (statistic, level) => {
      const x = statistic / 4;
      if (level <= 0.5 && a > 1 && b > 1 && x >= Math.max(mean, mode)) return true;
      return a > 0 && b > 0 && Number.isFinite(a + b) && x > 0 && x < 1 && logTailBound(x, a, b) - BOUND_MARGIN >= Math.log(level);
    },
  };
}

/** Row-major p x p product. */
function product(x: ArrayLike<number>, y: ArrayLike<number>, p: number): number[] {
  const out = new Array<number>(p * p).fill(0);
  for (let r = 0; r < p; r++) for (let c = 0; c < p; c++) for (let j = 0; j < p; j++) out[r * p + c] += x[r * p + j] * y[j * p + c];
  return out;
}

function traceOf(x: ArrayLike<number>, p: number): number {
  let sum = 0;
  for (let r = 0; r < p; r++) sum += x[r * p + r];
  return sum;
}

/**
 * The test for a pattern at level `p`: the statistic and its p-value where that could be under `p`,
 * undefined where the tail is surely at least `p`, as for nearly every run.
 */
export function durbinWatsonBelow(p: number, residuals: ArrayLike<number>, jacobian: ArrayLike<number>[], normalInverse: ArrayLike<number>): DurbinWatson | undefined {
  const statistic = statisticOf(residuals);
  const nullDistribution = durbinWatsonNull(jacobian, normalInverse);
  if (nullDistribution.tailAtLeast(statistic, p)) return undefined;
  return tested(statistic, nullDistribution);
}

function tested(statistic: number, nullDistribution: DurbinWatsonNull): DurbinWatson {
  return { statistic, expected: nullDistribution.expected, variance: nullDistribution.variance, pValue: nullDistribution.lowerTail(statistic) };
}

function statisticOf(residuals: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < residuals.length; i++) {
    den += residuals[i] * residuals[i];
    if (i > 0) num += (residuals[i] - residuals[i - 1]) ** 2;
  }
  return num / den;
}

export function durbinWatson(residuals: ArrayLike<number>, jacobian: ArrayLike<number>[], normalInverse: ArrayLike<number>): DurbinWatson {
  return tested(statisticOf(residuals), durbinWatsonNull(jacobian, normalInverse));
}
