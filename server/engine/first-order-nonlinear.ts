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
  iterations: number;
}

export interface NonlinearOptions {
  infinity: InfinityMode;
  /** A starting rate constant; by default from the linearised fit or the Guggenheim method. */
  initialK?: number;
}

const MAX_ITERATIONS = 200;

interface Profile {
  sse: number;
  /** x_inf (fitted or fixed) and amplitude A for this k. */
  xInf: number;
  amplitude: number;
  u: Float64Array;
  residuals: Float64Array;
}

/** The linear sub-problem at fixed k: best x_inf and A, and the residuals. */
function profileAt(k: number, t: number[], x: ArrayLike<number>, fixedInfinity: number | undefined): Profile {
  const n = t.length;
  const u = new Float64Array(n);
  for (let i = 0; i < n; i++) u[i] = Math.exp(-k * t[i]);
  let xInf: number;
  let amplitude: number;
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
    amplitude = sux / suu;
    xInf = xm - amplitude * um;
  } else {
    let suu = 0;
    let sux = 0;
    for (let i = 0; i < n; i++) {
      suu += u[i] * u[i];
      sux += u[i] * (x[i] - fixedInfinity);
    }
    amplitude = sux / suu;
    xInf = fixedInfinity;
  }
  const residuals = new Float64Array(n);
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = x[i] - xInf - amplitude * u[i];
    residuals[i] = r;
    sse += r * r;
  }
  return { sse, xInf, amplitude, u, residuals };
}

/** Kaufman's Jacobian of the residuals with respect to k: (I - P)(A t u), P the projection on the linear columns. */
function projectedJacobian(p: Profile, t: number[], fitted: boolean): Float64Array {
  const n = t.length;
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) v[i] = p.amplitude * t[i] * p.u[i];
  let uu = 0;
  let uv = 0;
  let um = 0;
  let vm = 0;
  if (fitted) {
    for (let i = 0; i < n; i++) {
      um += p.u[i];
      vm += v[i];
    }
    um /= n;
    vm /= n;
  }
  for (let i = 0; i < n; i++) {
    uu += (p.u[i] - um) * (p.u[i] - um);
    uv += (p.u[i] - um) * (v[i] - vm);
  }
  const b = uv / uu;
  for (let i = 0; i < n; i++) v[i] = v[i] - vm - b * (p.u[i] - um);
  return v;
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
  let current = profileAt(k, t, x, fixedInfinity);
  let lambda = 1e-3;
  let iterations = 0;
  let converged = false;
  while (iterations < MAX_ITERATIONS && !converged) {
    iterations++;
    const jac = projectedJacobian(current, t, fitted);
    let g = 0;
    let h = 0;
    for (let i = 0; i < t.length; i++) {
      g += jac[i] * current.residuals[i];
      h += jac[i] * jac[i];
    }
    if (h === 0 || current.sse === 0) break;
    for (;;) {
      const step = -g / (h * (1 + lambda));
      const trial = profileAt(k + step, t, x, fixedInfinity);
      if (trial.sse <= current.sse) {
        const relativeGain = (current.sse - trial.sse) / current.sse;
        k += step;
        current = trial;
        lambda = Math.max(lambda / 10, 1e-12);
        converged = Math.abs(step) <= 1e-13 * Math.abs(k) || relativeGain <= 1e-15;
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
  const dk = new Float64Array(n);
  for (let i = 0; i < n; i++) dk[i] = -current.amplitude * t[i] * current.u[i];
  const columns: ArrayLike<number>[] = [dk, current.u];
  if (fitted) columns.push(new Float64Array(n).fill(1));
  const inv = inverseNormalMatrix(columns);
  const dof = n - parameters;
  const s2 = current.sse / dof;
  const tc = tCritical95(dof);
  const estimate = (value: number, variance: number, unit: string): Estimate => {
    const se = Math.sqrt(Math.max(variance, 0) * s2);
    return { value, standardError: se, ci95: [value - tc * se, value + tc * se], unit };
  };
  const readingUnit = run.readingUnit ?? '';
  const kEstimate = estimate(k, inv[0][0], rateUnitOf(run.timeUnit));
  const x0Variance = fitted ? inv[1][1] + inv[2][2] + 2 * inv[1][2] : inv[1][1];
  return {
    infinityMode: options.infinity,
    k: kEstimate,
    halfLife: halfLifeOf(kEstimate, run.timeUnit),
    x0: estimate(current.xInf + current.amplitude, x0Variance, readingUnit),
    infinity: estimate(current.xInf, fitted ? inv[2][2] : 0, readingUnit),
    residualSD: Math.sqrt(s2),
    dof,
    residuals: Array.from(current.residuals),
    iterations,
  };
}
