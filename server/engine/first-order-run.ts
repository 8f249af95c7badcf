import { EngineError, requireFinite } from './engine-error.ts';
import { MIN_POINTS } from './linear-fit.ts';

/**
 * One kinetic run followed by a physical observable x (optical rotation, absorbance, conductance):
 * readings x(t) and, where it was measured, the end value x_inf. Times are in `timeUnit` and count
 * from any origin: fits measure time from the first reading, which is x_0.
 */
export interface FirstOrderRun {
  times: ArrayLike<number>;
  readings: ArrayLike<number>;
  timeUnit: string;
  infinity?: number;
  /** Unit of the readings, e.g. 'deg', carried into fitted x_0 and x_inf. */
  readingUnit?: string;
}

/** Checks a run's arrays and returns the times since the first reading. */
export function elapsedTimes(run: FirstOrderRun): number[] {
  const { times, readings } = run;
  if (times.length !== readings.length) {
    throw new EngineError('too-few-points', `${times.length} times but ${readings.length} readings`, 'readings');
  }
  if (times.length < MIN_POINTS) {
    throw new EngineError('too-few-points', `a run needs at least ${MIN_POINTS} readings, got ${times.length}`, 'readings');
  }
  requireFinite(times, 'times');
  requireFinite(readings, 'readings');
  const t0 = times[0];
  let allEqual = true;
  for (let i = 1; i < times.length && allEqual; i++) allEqual = times[i] === t0;
  if (allEqual) {
    throw new EngineError('degenerate-x', 'all times are equal, so no rate can be fitted', 'times');
  }
  const elapsed = new Array<number>(times.length);
  for (let i = 0; i < times.length; i++) {
    // Equal times are allowed (replicate readings fit like any other points); going back is not.
    if (i > 0 && times[i] < times[i - 1]) {
      throw new EngineError(
        'times-not-increasing',
        `times[${i}] = ${times[i]} comes before times[${i - 1}] = ${times[i - 1]}`,
        `times[${i}]`,
      );
    }
    elapsed[i] = times[i] - t0;
  }
  return elapsed;
}

export interface FirstOrderTransform {
  /** Time since the first reading, in the run's time unit. */
  t: number[];
  /** F = (x_t - x_inf) / (x_0 - x_inf), the fraction of the change still to come. */
  F: number[];
  lnF: number[];
}

export function firstOrderTransform(run: FirstOrderRun, infinity: number): FirstOrderTransform {
  const t = elapsedTimes(run);
  if (!Number.isFinite(infinity)) {
    throw new EngineError('non-finite', `the end value x_inf is ${String(infinity)}, not a finite number`, 'infinity');
  }
  const { readings } = run;
  const span = readings[0] - infinity;
  if (span === 0) {
    throw new EngineError('non-positive-ratio', `x_inf = ${infinity} equals the first reading x_0, so F is undefined`, 'infinity');
  }
  const F = new Array<number>(t.length);
  const lnF = new Array<number>(t.length);
  for (let i = 0; i < t.length; i++) {
    const f = (readings[i] - infinity) / span;
    if (!(f > 0)) {
      throw new EngineError(
        'non-positive-ratio',
        `reading ${i} (x = ${readings[i]}) is not on the same side of x_inf = ${infinity} as x_0 = ${readings[0]}, so ln F is undefined`,
        `readings[${i}]`,
      );
    }
    F[i] = f;
    lnF[i] = Math.log(f);
  }
  return { t, F, lnF };
}
