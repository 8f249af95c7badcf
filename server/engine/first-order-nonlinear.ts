import { inverseNormalMatrix } from './covariance.ts';
import { EngineError } from './engine-error.ts';
import { halfLifeOf, type Estimate } from './estimate.ts';
import { elapsedTimes, firstOrderTransform, type FirstOrderRun } from './first-order-run.ts';
import { fitGuggenheim } from './guggenheim.ts';
import { fitLine } from './linear-fit.ts';
import { tCritical95 } from './student-t.ts';
import { rateUnitOf } from './units.ts';

/**
 * The exponential model x(t) = x_inf + (x_0 - x_inf) e^(-k t), fitted to the readings themselves, by
 * variable projection: for a given k the model is a straight line in u = e^(-k t) (intercept x_inf,
 * slope A = x_0 - x_inf), so only k is searched, by Levenberg-Marquardt steps on Kaufman's
 * approximation of the projected Jacobian. Standard errors come from the full Jacobian at the optimum.
 */
export type InfinityMode = 'fixed' | 'fitted';

export interface FirstOrderNonlinearFit {
  infinityMode: InfinityMode;
  k: Estimate;
  halfLife: Estimate;
  /** Fitted x at the first reading's time. */
  x0: Estimate;
  /** Fitted x_inf, or the measured one with zero standard error when fixed. */
  infinity: Estimate;
  residualSD: number;
  dof: number;
  residuals: number[];
  /** Leverage of each reading: the diagonal of J (J'J)^-1 J' at the optimum. */
  leverages: number[];
  /** The Jacobian's columns at the optimum (k, A, and x_inf when fitted) and (J'J)^-1, row-major. */
  jacobian: ArrayLike<number>[];
  normalInverse: number[];
  iterations: number;
}

export interface NonlinearOptions {
  infinity: InfinityMode;
  /** A starting rate constant; by default from the linearised fit or the Guggenheim method. */
  initialK?: number;
}

const MAX_ITERATIONS = 200;

/** The linear sub-problem at one k: best x_inf and A, with u = e^(-k t) and the residuals kept in buffers. */
class Profile {
  sse = 0;
  xInf = 0;
  amplitude = 0;
  // Sized for the longest run so far and reused (see scratchProfiles); entries past t.length are stale.
  readonly u: number[];
  readonly residuals: number[];
  constructor(n: number) {
    this.u = new Array<number>(n);
    this.residuals = new Array<number>(n);
  }

  evaluate(k: number, t: number[], x: ArrayLike<number>, fixedInfinity: number | undefined): this {
    const { u, residuals } = this;
    const n = t.length;
    for (let i = 0; i < n; i++) u[i] = Math.exp(-k * t[i]);
    if (fixedInfinity === undefined) {
      let um = 0;
      let xm = 0;
      for (let i = 0; i < n; i++) {
        um += u[i];
        xm += x[i];
      }
      um /= n;
      xm /= n;
      let suu = 0;
      let sux = 0;
      for (let i = 0; i < n; i++) {
        suu += (u[i] - um) * (u[i] - um);
        sux += (u[i] - um) * (x[i] - xm);
      }
      this.amplitude = sux / suu;
      this.xInf = xm - this.amplitude * um;
    } else {
      let suu = 0;
      let sux = 0;
      for (let i = 0; i < n; i++) {
        suu += u[i] * u[i];
        sux += u[i] * (x[i] - fixedInfinity);
      }
      this.amplitude = sux / suu;
      this.xInf = fixedInfinity;
    }
    let sse = 0;
    for (let i = 0; i < n; i++) {
      const r = x[i] - this.xInf - this.amplitude * u[i];
      residuals[i] = r;
      sse += r * r;
    }
    this.sse = sse;
    return this;
  }
}

// The search's buffers, reused from fit to fit: a check makes a dozen exponential fits per submission.
let profiles: [Profile, Profile] = [new Profile(64), new Profile(64)];
let scratchJacobian = new Array<number>(64).fill(0);

function scratchProfiles(n: number): [Profile, Profile] {
  if (profiles[0].u.length < n) {
    profiles = [new Profile(2 * n), new Profile(2 * n)];
    scratchJacobian = new Array<number>(2 * n).fill(0);
  }
  return profiles;
}

// The x_inf column of the Jacobian is all ones; fits of one length share it (nothing writes to it).
const ones = new Map<number, readonly number[]>();
function onesOf(n: number): readonly number[] {
  let column = ones.get(n);
  if (!column) {
    column = new Array<number>(n).fill(1);
    ones.set(n, column);
  }
  return column;
}

/**
 * Kaufman's derivative of the residuals with respect to k, (I - P)(A t u) with P the projection on the
 * linear columns, written into `out`; returns its products with the residuals and with itself.
 */
function projectedJacobian(p: Profile, t: number[], fitted: boolean, out: number[]): { g: number; h: number } {
  const n = t.length;
  const { u } = p;
  let um = 0;
  let vm = 0;
  for (let i = 0; i < n; i++) {
    out[i] = p.amplitude * t[i] * u[i];
    if (fitted) {
      um += u[i];
      vm += out[i];
    }
  }
  um /= n;
  vm /= n;
  let uu = 0;
  let uv = 0;
  for (let i = 0; i < n; i++) {
    uu += (u[i] - um) * (u[i] - um);
    uv += (u[i] - um) * (out[i] - vm);
  }
  const b = uv / uu;
  let g = 0;
  let h = 0;
  for (let i = 0; i < n; i++) {
    const j = out[i] - vm - b * (u[i] - um);
    out[i] = j;
    g += j * p.residuals[i];
    h += j * j;
  }
  return { g, h };
}

function estimateOf(value: number, variance: number, tc: number, unit: string): Estimate {
  const se = Math.sqrt(Math.max(variance, 0));
  return { value, standardError: se, ci95: [value - tc * se, value + tc * se], unit };
}

function startingK(run: FirstOrderRun, t: number[]): number {
  try {
    if (run.infinity !== undefined) {
      const tr = firstOrderTransform(run, run.infinity);
      return -fitLine(tr.t, tr.lnF).slope;
    }
    return fitGuggenheim(run).k.value;
  } catch (e) {
    if (!(e instanceof EngineError)) throw e;
    // Data too rough for either shortcut: start at one e-fold over the run.
    return 1 / t[t.length - 1];
  }
}

export function fitFirstOrderNonlinear(run: FirstOrderRun, options: NonlinearOptions): FirstOrderNonlinearFit {
  const t = elapsedTimes(run);
  const x = run.readings;
  const fitted = options.infinity === 'fitted';
  if (!fitted && (run.infinity === undefined || !Number.isFinite(run.infinity))) {
    throw new EngineError('non-finite', 'a fit with x_inf fixed needs a measured, finite x_inf', 'infinity');
  }
  const fixedInfinity = fitted ? undefined : run.infinity;
  const parameters = fitted ? 3 : 2;
  if (t.length <= parameters) {
    throw new EngineError('too-few-points', `the exponential fit needs more than ${parameters} readings`, 'readings');
  }

  let k = options.initialK ?? startingK(run, t);
  const buffers = scratchProfiles(t.length);
  let current = buffers[0].evaluate(k, t, x, fixedInfinity);
  let trial = buffers[1];
  const jacobian = scratchJacobian;
  let lambda = 1e-3;
  let iterations = 0;
  let converged = false;
  while (iterations < MAX_ITERATIONS && !converged) {
    iterations++;
    const { g, h } = projectedJacobian(current, t, fitted, jacobian);
    if (h === 0 || current.sse === 0) break;
    for (;;) {
      const step = -g / (h * (1 + lambda));
      // A step of 1e-9 k is far inside any reported precision; near the optimum each step is larger
      // than the error that remains, and a smaller one only measures rounding in the sum of squares.
      if (Math.abs(step) <= 1e-9 * Math.abs(k)) {
        converged = true;
        break;
      }
      trial.evaluate(k + step, t, x, fixedInfinity);
      if (trial.sse <= current.sse) {
        k += step;
        const accepted = trial;
        trial = current;
        current = accepted;
        lambda = Math.max(lambda / 10, 1e-12);
        break;
      }
      lambda *= 10;
      // No step along the gradient lowers the sum of squares: k is at the minimum to rounding.
      if (lambda > 1e12) {
        converged = true;
        break;
      }
    }
  }
  if (!converged && iterations >= MAX_ITERATIONS) {
    throw new EngineError('no-convergence', `the exponential fit did not converge in ${MAX_ITERATIONS} iterations`, 'readings');
  }

  const n = t.length;
  // The search ran in scratch buffers: the fit keeps copies of the ones it returns.
  const u = current.u.slice(0, n);
  const residuals = current.residuals.slice(0, n);
  // Jacobian columns of the model in parameter order k, A (, x_inf).
  const dk = new Array<number>(n);
  for (let i = 0; i < n; i++) dk[i] = -current.amplitude * t[i] * u[i];
  const columns: ArrayLike<number>[] = fitted ? [dk, u, onesOf(n)] : [dk, u];
  // Row-major (J'J)^-1: var k at [0]; var A at [4] (3 x 3) or [3] (2 x 2); var x_inf at [8], cov(A, x_inf) at [5].
  const inv = inverseNormalMatrix(columns);
  const leverages = new Array<number>(n);
  for (let i = 0; i < n; i++) {
    let h = 0;
    for (let r = 0; r < parameters; r++) for (let c = 0; c < parameters; c++) h += columns[r][i] * inv[r * parameters + c] * columns[c][i];
    leverages[i] = h;
  }
  const dof = n - parameters;
  const s2 = current.sse / dof;
  const tc = tCritical95(dof);
  const readingUnit = run.readingUnit ?? '';
  const kEstimate = estimateOf(k, inv[0] * s2, tc, rateUnitOf(run.timeUnit));
  const x0Variance = fitted ? inv[4] + inv[8] + 2 * inv[5] : inv[3];
  return {
    infinityMode: options.infinity,
    k: kEstimate,
    halfLife: halfLifeOf(kEstimate, run.timeUnit),
    x0: estimateOf(current.xInf + current.amplitude, x0Variance * s2, tc, readingUnit),
    infinity: estimateOf(current.xInf, fitted ? inv[8] * s2 : 0, tc, readingUnit),
    residualSD: Math.sqrt(s2),
    dof,
    residuals,
    leverages,
    jacobian: columns,
    normalInverse: inv,
    iterations,
  };
}
