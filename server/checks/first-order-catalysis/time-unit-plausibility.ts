import type { Settings } from '../../../schemas/kinds/first-order-catalysis.ts';
import { convert, rateUnitOf } from '../../engine/units.ts';
import type { DraftFinding } from '../draft-finding.ts';
import { fmt } from '../format.ts';
import type { RunAnalysis } from './run-analysis.ts';

// Outside the band by more than this factor, a k is not one this experiment gives (common practice,
// no source); a minute is 60 seconds and an hour 60 minutes, the slips of unit looked for.
const FAR_OUTSIDE = 30;
const UNIT_STEP = 60;

const TIME_NAMES: Array<[number, string]> = [[1, 's'], [60, 'min'], [3600, 'h']];

function timeName(secondsPerUnit: number): string | undefined {
  return TIME_NAMES.find(([f]) => Math.abs(secondsPerUnit - f) <= 1e-9 * f)?.[1];
}

/**
 * The k_obs a run at this concentration should have by the assignment's reference bands (k_N + k_A c
 * with each at the ends of its band), per second; undefined without both bands.
 */
function expectedBand(settings: Settings, concentrationM: number): [number, number] | undefined {
  const { kN, kA } = settings.reference ?? {};
  if (!kN || !kA) return undefined;
  const perSecond = (v: number, unit: string) => convert(v, unit, 's^-1');
  const perMolarSecond = (v: number, unit: string) => convert(v, unit, 'M^-1 s^-1');
  return [perSecond(kN.min, kN.unit) + perMolarSecond(kA.min, kA.unit) * concentrationM, perSecond(kN.max, kN.unit) + perMolarSecond(kA.max, kA.unit) * concentrationM];
}

/**
 * A run whose k, in its declared time unit, lies outside the reference band by more than a factor of
 * 30 while the same readings with times 60 times longer or shorter put it inside: the times were
 * probably in another unit (seconds for minutes). A warning, no points: the k reported in the
 * declared unit is graded as ever.
 */
export function timeUnitImplausible(a: RunAnalysis, settings: Settings): DraftFinding | undefined {
  const band = expectedBand(settings, a.concentrationM);
  if (!band || a.undetermined) return undefined;
  const [low, high] = band;
  const k = convert(a.expected.value, rateUnitOf(a.timeUnit), 's^-1');
  const inBand = (v: number) => v >= low && v <= high;
  if (!(k > high * FAR_OUTSIDE || (low > 0 && k < low / FAR_OUTSIDE))) return undefined;
  // Times m times longer than declared divide k by m.
  const m = [UNIT_STEP, 1 / UNIT_STEP].find((f) => inBand(k / f));
  if (m === undefined) return undefined;
  const declared = timeName(a.timeUnit.factor) ?? a.timeUnit.text;
  const meant = timeName(a.timeUnit.factor * m);
  const unitHere = rateUnitOf(a.timeUnit);
  const toHere = (v: number) => convert(v, 's^-1', unitHere);
  return {
    code: 'time-unit-implausible',
    path: `${a.path}.timeUnit`,
    stage: 'readings',
    severity: 'warning',
    charge: 0,
    message:
      `With times in ${declared}, run "${a.label}" gives k_obs = ${fmt(toHere(k))} ${unitHere}, ${m > 1 ? 'more' : 'less'} than ${FAR_OUTSIDE} times ` +
      `${m > 1 ? 'above' : 'below'} the ${fmt(toHere(low))} to ${fmt(toHere(high))} ${unitHere} this experiment gives at ${fmt(a.concentrationM)} M. ` +
      `Read with times ${UNIT_STEP} times ${m > 1 ? 'longer' : 'shorter'}${meant ? ` (in ${meant})` : ''}, it lies inside: the times were probably ${meant ? `in ${meant}` : 'in another unit'}. ` +
      'Your k is checked in the unit you declared; please check the time unit of this run.',
  };
}
