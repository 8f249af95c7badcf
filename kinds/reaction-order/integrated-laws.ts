import { durbinWatson } from '../../server/engine/durbin-watson.ts';
import { EngineError } from '../../server/engine/engine-error.ts';
import type { Estimate } from '../../server/engine/estimate.ts';
import { fitThroughOrigin } from '../../server/engine/linear-fit.ts';
import { tCritical95 } from '../../server/engine/student-t.ts';
import { inverseSymmetric } from './symmetric-solve.ts';

/**
 * The integrated rate laws of -d[A]/dt = k [A]^n for n = 0, 1, 2, every run fitted at once with one
 * k and each run its own [A]_0 (textbook physical chemistry, from memory):
 *   n = 0: [A] = [A]_0 - k t         linear form [A] against t, slope -k
 *   n = 1: [A] = [A]_0 e^(-k t)      linear form ln [A] against t, slope -k
 *   n = 2: [A] = [A]_0 / (1 + [A]_0 k t)   linear form 1/[A] against t, slope +k
 * Times are in one unit, concentrations in M; k comes out in M^(1-n) per that time unit.
 */
export type LawOrder = 0 | 1 | 2;

export interface RunSeries {
  t: readonly number[];
  c: readonly number[];
}

/** The linear form's y for a concentration, or undefined where it has none (ln or 1/x of c <= 0). */
function linearForm(order: LawOrder, c: number): number | undefined {
  if (order === 0) return c;
  if (!(c > 0)) return undefined;
  return order === 1 ? Math.log(c) : 1 / c;
}

const SLOPE_SIGN: Record<LawOrder, number> = { 0: -1, 1: -1, 2: 1 };
const FORM: Record<LawOrder, string> = { 0: '[A]', 1: 'ln [A]', 2: '1/[A]' };

export interface LinearLaw {
  k: Estimate;
  intercepts: number[];
  residualSS: number;
  dof: number;
  readingsLeftOut: number;
}

function estimate(value: number, se: number, dof: number, unit: string): Estimate {
  const t = tCritical95(dof);
  return { value, standardError: se, ci95: [value - t * se, value + t * se], unit };
}

/**
 * The linear form fitted with a common slope and one intercept per run: centring each run on its own
 * means turns it into one line through the origin (the within-runs regression), whose slope is the
 * common slope; its standard error counts one degree of freedom more per run for the intercepts.
 */
export function fitLinearLaw(order: LawOrder, runs: readonly RunSeries[], unit: string): LinearLaw {
  const xs: number[] = [];
  const ys: number[] = [];
  const means: Array<{ x: number; y: number }> = [];
  let leftOut = 0;
  for (const [r, run] of runs.entries()) {
    const x: number[] = [];
    const y: number[] = [];
    run.c.forEach((c, i) => {
      const v = linearForm(order, c);
      if (v === undefined) leftOut++;
      else {
        x.push(run.t[i]);
        y.push(v);
      }
    });
    // Every run has its own intercept: a run the form cannot take (its ln or 1/[A] undefined) leaves no line.
    if (x.length < 2) throw new EngineError('too-few-points', `run ${r + 1} has ${x.length === 0 ? 'no reading' : 'one reading'} the ${FORM[order]} form can take`, `runs[${r}].readings`);
    const mx = x.reduce((a, b) => a + b, 0) / x.length;
    const my = y.reduce((a, b) => a + b, 0) / y.length;
    means.push({ x: mx, y: my });
    x.forEach((v, i) => {
      xs.push(v - mx);
      ys.push(y[i] - my);
    });
  }
  const dof = xs.length - runs.length - 1;
  if (runs.length === 0 || dof < 1) throw new EngineError('too-few-points', `the ${['zero', 'first', 'second'][order]}-order line has too few readings to fit`, 'runs');
  const line = fitThroughOrigin(xs, ys);
  const sxx = xs.reduce((a, v) => a + v * v, 0);
  if (!(sxx > 0)) throw new EngineError('degenerate-x', 'every run has all its times equal', 'runs');
  const residualSS = line.residuals.reduce((a, r) => a + r * r, 0);
  const se = Math.sqrt(residualSS / dof / sxx);
  return {
    k: estimate(SLOPE_SIGN[order] * line.slope, se, dof, unit),
    intercepts: means.map((m) => m.y - line.slope * m.x),
    residualSS,
    dof,
    readingsLeftOut: leftOut,
  };
}

/** [A] at time t by the law, and its derivatives by [A]_0 and by k. */
function lawAt(order: LawOrder, c0: number, k: number, t: number): { c: number; dc0: number; dk: number } {
  if (order === 0) return { c: c0 - k * t, dc0: 1, dk: -t };
  if (order === 1) {
    const e = Math.exp(-k * t);
    return { c: c0 * e, dc0: e, dk: -t * c0 * e };
  }
  const d = 1 + c0 * k * t;
  return { c: c0 / d, dc0: 1 / (d * d), dk: (-c0 * c0 * t) / (d * d) };
}

export interface NonlinearLaw {
  k: Estimate;
  initialConcentrations: number[];
  residualSS: number;
  dof: number;
  durbinWatson: number;
  patternP: number;
  residuals: number[][];
}

const MAX_ITERATIONS = 200;

/** Sum of squares and residuals at the parameters [k, c0_1, ..., c0_R]; Infinity where the law is undefined (1 + [A]_0 k t <= 0). */
function residualsAt(order: LawOrder, runs: readonly RunSeries[], theta: readonly number[]): { sse: number; residuals: number[][] } {
  let sse = 0;
  const residuals = runs.map((run, r) =>
    run.t.map((t, i) => {
      if (order === 2 && !(1 + theta[r + 1] * theta[0] * t > 0)) sse = Infinity;
      const e = run.c[i] - lawAt(order, theta[r + 1], theta[0], t).c;
      sse += e * e;
      return e;
    }),
  );
  return { sse, residuals };
}

/** The Jacobian's columns (k first, then each run's [A]_0), over every reading in run order. */
function jacobianAt(order: LawOrder, runs: readonly RunSeries[], theta: readonly number[]): number[][] {
  const n = runs.reduce((a, r) => a + r.t.length, 0);
  const columns = theta.map(() => new Array<number>(n).fill(0));
  let at = 0;
  runs.forEach((run, r) => {
    for (const t of run.t) {
      const d = lawAt(order, theta[r + 1], theta[0], t);
      columns[0][at] = d.dk;
      columns[r + 1][at] = d.dc0;
      at++;
    }
  });
  return columns;
}

function normalMatrix(columns: number[][]): number[] {
  const p = columns.length;
  const a = new Array<number>(p * p);
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = 0;
      for (let i = 0; i < columns[r].length; i++) s += columns[r][i] * columns[c][i];
      a[r * p + c] = s;
      a[c * p + r] = s;
    }
  }
  return a;
}

/**
 * The law fitted to the concentrations themselves by Levenberg-Marquardt from a start (usually the
 * linear form's k and intercepts). The concentrations are the signal less a constant, over a
 * constant, so the fit leaves the signal's noise where it was measured and its k is the same as a fit
 * to the signal. Standard errors from s^2 (J'J)^-1 with s^2 = SSE / (n - p), as an unweighted fit gives them.
 */
export function fitNonlinearLaw(order: LawOrder, runs: readonly RunSeries[], start: { k: number; c0: number[] }, unit: string): NonlinearLaw {
  const n = runs.reduce((a, r) => a + r.t.length, 0);
  const p = runs.length + 1;
  if (n - p < 2) throw new EngineError('too-few-points', 'too few readings for the fit to the concentrations', 'runs');
  let theta = [start.k, ...start.c0];
  let current = residualsAt(order, runs, theta);
  if (!Number.isFinite(current.sse)) {
    theta = [0, ...start.c0];
    current = residualsAt(order, runs, theta);
  }
  let lambda = 1e-3;
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const columns = jacobianAt(order, runs, theta);
    const a = normalMatrix(columns);
    const flat = current.residuals.flat();
    const g = columns.map((col) => col.reduce((s, v, i) => s + v * flat[i], 0));
    let improved = false;
    let step: number[] = [];
    for (let tries = 0; tries < 30 && !improved; tries++) {
      const damped = a.map((v, i) => (Math.floor(i / p) === i % p ? v * (1 + lambda) : v));
      const inv = inverseSymmetric(damped, p);
      step = g.map((_, r) => g.reduce((s, gc, c) => s + inv[r * p + c] * gc, 0));
      const next = theta.map((v, i) => v + step[i]);
      const trial = residualsAt(order, runs, next);
      if (trial.sse <= current.sse) {
        const gain = current.sse - trial.sse;
        theta = next;
        current = trial;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = true;
        if (gain <= 1e-15 * current.sse && step.every((s, i) => Math.abs(s) <= 1e-10 * (Math.abs(theta[i]) + 1e-300))) iteration = MAX_ITERATIONS;
      } else {
        lambda *= 10;
      }
    }
    if (!improved) break;
  }
  const columns = jacobianAt(order, runs, theta);
  const inv = inverseSymmetric(normalMatrix(columns), p);
  const dof = n - p;
  const s2 = current.sse / dof;
  const flat = current.residuals.flat();
  // Residuals all zero (data exactly on the law) have no Durbin-Watson statistic, and no pattern.
  const dw = current.sse > 0 ? durbinWatson(flat, columns, inv) : { statistic: 2, pValue: 1 };
  return {
    k: estimate(theta[0], Math.sqrt(s2 * inv[0]), dof, unit),
    initialConcentrations: theta.slice(1),
    residualSS: current.sse,
    dof,
    durbinWatson: dw.statistic,
    patternP: dw.pValue,
    residuals: current.residuals,
  };
}

/** [A]_0 from a linear form's intercept, where it gives one. */
export function initialFromIntercept(order: LawOrder, intercept: number): number | undefined {
  if (order === 0) return intercept;
  if (order === 1) return Math.exp(intercept);
  return intercept > 0 ? 1 / intercept : undefined;
}

/**
 * A run's half-life by each law: [A]_0 / (2k), ln 2 / k and 1 / (k [A]_0). Its standard error and
 * interval follow k's alone ([A]_0 taken as known); the half-life falls as k rises.
 */
export function halfLifeFormula(order: LawOrder, k: number, c0: number): number {
  if (order === 0) return c0 / (2 * k);
  if (order === 1) return Math.LN2 / k;
  return 1 / (k * c0);
}

export function halfLifeEstimate(order: LawOrder, k: Estimate, c0: number, timeUnit: string): Estimate {
  const value = halfLifeFormula(order, k.value, c0);
  return {
    value,
    standardError: (value * k.standardError) / Math.abs(k.value),
    ci95: [halfLifeFormula(order, k.ci95[1], c0), k.ci95[0] > 0 ? halfLifeFormula(order, k.ci95[0], c0) : Infinity],
    unit: timeUnit,
  };
}
