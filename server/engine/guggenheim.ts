import { EngineError } from './engine-error.ts';
import { halfLifeOf, negatedSlope, type Estimate } from './estimate.ts';
import { elapsedTimes, type FirstOrderRun } from './first-order-run.ts';
import { fitLine, MIN_POINTS, type LineFit } from './linear-fit.ts';
import { rateUnitOf } from './units.ts';

/**
 * The Guggenheim method, for a run whose end value was never measured: with readings a constant
 * interval D apart, ln|x_t - x_(t+D)| = -k t + ln|(x_0 - x_inf)(1 - e^(-kD))|, a straight line whose
 * slope needs no x_inf.
 */
export interface GuggenheimFit {
  k: Estimate;
  halfLife: Estimate;
  /** The interval D, in the run's time unit. */
  interval: number;
  /** Index pairs [i, j] of the readings used, t_j = t_i + D. */
  pairs: Array<[number, number]>;
  line: LineFit;
}

/** Matches each reading with the one D later; times equal to within a part in 1e9 of the run's span. */
function pairsAtInterval(t: number[], interval: number): Array<[number, number]> {
  const tolerance = 1e-9 * t[t.length - 1];
  const pairs: Array<[number, number]> = [];
  let j = 0;
  for (let i = 0; i < t.length; i++) {
    const target = t[i] + interval;
    while (j < t.length && t[j] < target - tolerance) j++;
    if (j === t.length) break;
    if (Math.abs(t[j] - target) <= tolerance) pairs.push([i, j]);
  }
  return pairs;
}

/**
 * Fits a run by the Guggenheim method. Without an interval, D is the time from the first reading to
 * the middle one, which pairs the first half of the run with the second: the longest interval that
 * still leaves half the readings as pairs (a longer D gives a better-conditioned fit; common practice,
 * no source).
 */
export function fitGuggenheim(run: FirstOrderRun, interval?: number): GuggenheimFit {
  const t = elapsedTimes(run);
  const D = interval ?? t[Math.floor(t.length / 2)];
  if (!(D > 0)) {
    throw new EngineError('no-interval-pairs', `the interval must be a positive time, got ${D}`, 'interval');
  }
  const pairs = pairsAtInterval(t, D);
  if (pairs.length < MIN_POINTS) {
    throw new EngineError(
      'no-interval-pairs',
      `only ${pairs.length} pairs of readings are ${D} ${run.timeUnit} apart; the method needs ${MIN_POINTS}`,
      'times',
    );
  }
  const { readings } = run;
  const sign = Math.sign(readings[pairs[0][0]] - readings[pairs[0][1]]);
  const x: number[] = [];
  const y: number[] = [];
  for (const [i, j] of pairs) {
    const d = (readings[i] - readings[j]) * sign;
    if (!(d > 0)) {
      throw new EngineError(
        'non-positive-ratio',
        `readings ${i} and ${j} do not change in the direction of the rest of the run, so ln|x_t - x_(t+D)| is undefined or reversed`,
        `readings[${j}]`,
      );
    }
    x.push(t[i]);
    y.push(Math.log(d));
  }
  const line = fitLine(x, y);
  const k = negatedSlope(line, rateUnitOf(run.timeUnit));
  return { k, halfLife: halfLifeOf(k, run.timeUnit), interval: D, pairs, line };
}
