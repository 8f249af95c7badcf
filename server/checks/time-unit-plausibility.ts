import { convert, rateUnitOf, type Unit } from '../engine/units.ts';
import type { DraftFinding } from './draft-finding.ts';
import { fmt } from './format.ts';

// Outside the band by more than this factor, a k is not one the experiment gives (common practice,
// no source); a minute is 60 seconds and an hour 60 minutes, the slips of unit looked for.
const FAR_OUTSIDE = 30;
const UNIT_STEP = 60;

const TIME_NAMES: Array<[number, string]> = [[1, 's'], [60, 'min'], [3600, 'h']];

function timeName(secondsPerUnit: number): string | undefined {
  return TIME_NAMES.find(([f]) => Math.abs(secondsPerUnit - f) <= 1e-9 * f)?.[1];
}

export interface TimeUnitCheck {
  path: string;
  stage: string;
  /** The run in words, e.g. `run "R2"`. */
  what: string;
  /** Where the band applies, e.g. `at 0.2 M`. */
  where: string;
  timeUnit: Unit;
  /** Our k of the run, per second as its times are declared. */
  kPerSecond: number;
  /** What the experiment gives there, per second. */
  band: [number, number];
}

/** Times that cannot be in their declared unit: the finding, and the unit they were probably in. */
export interface ImplausibleTimes {
  draft: DraftFinding;
  meant: string;
}

/**
 * A run whose k, in its declared time unit, lies outside the band by more than a factor of 30 while
 * the same readings with times 60 times longer or shorter put it inside: the times were probably in
 * another unit (seconds for minutes). A warning, no points: the run is then graded as if its times
 * were in that unit, as a TA reads what was meant (the same as a temperature in degrees Celsius typed
 * as kelvin). Undefined when the run's k is plausible or no named unit makes it so.
 */
export function timeUnitImplausible(c: TimeUnitCheck): ImplausibleTimes | undefined {
  const [low, high] = c.band;
  const k = c.kPerSecond;
  const inBand = (v: number) => v >= low && v <= high;
  if (!(k > high * FAR_OUTSIDE || (low > 0 && k < low / FAR_OUTSIDE))) return undefined;
  // Times m times longer than declared divide k by m.
  const m = [UNIT_STEP, 1 / UNIT_STEP].find((f) => inBand(k / f));
  if (m === undefined) return undefined;
  const declared = timeName(c.timeUnit.factor) ?? c.timeUnit.text;
  const meant = timeName(c.timeUnit.factor * m);
  if (meant === undefined) return undefined;
  const unitHere = rateUnitOf(c.timeUnit);
  const here = (v: number) => fmt(convert(v, 's^-1', unitHere));
  const draft: DraftFinding = {
    code: 'time-unit-implausible',
    path: c.path,
    stage: c.stage,
    severity: 'warning',
    charge: 0,
    message:
      `With times in ${declared}, ${c.what} gives k = ${here(k)} ${unitHere}, more than ${FAR_OUTSIDE} times ${m > 1 ? 'above' : 'below'} ` +
      `the ${here(low)} to ${here(high)} ${unitHere} this experiment gives ${c.where}. ` +
      `Read with times ${UNIT_STEP} times ${m > 1 ? 'longer' : 'shorter'} (in ${meant}), it lies inside: the times were probably in ${meant}. ` +
      `The run is checked as if its times were in ${meant}; please check the time unit of this run.`,
  };
  return { draft, meant };
}
