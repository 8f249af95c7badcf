import type { Settings, SubmittedRun } from '../schemas.ts';
import { convert, rateUnitOf } from '../../../server/engine/units.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { fmt } from '../../../server/checks/format.ts';
import { timeUnitImplausible, type ImplausibleTimes } from '../../../server/checks/time-unit-plausibility.ts';
import { analyseRun, isFitted, type RunAnalysis, type UnfittedRun } from './run-analysis.ts';

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

/** A run's times that cannot fit their declared unit, judged by the reference bands of k_N and k_A. */
function runTimeUnitImplausible(a: RunAnalysis, settings: Settings): ImplausibleTimes | undefined {
  const band = expectedBand(settings, a.concentrationM);
  if (!band || a.undetermined) return undefined;
  return timeUnitImplausible({
    path: `${a.path}.timeUnit`,
    stage: 'readings',
    what: `run "${a.label}"`,
    where: `at ${fmt(a.concentrationM)} M`,
    timeUnit: a.timeUnit,
    kPerSecond: convert(a.expected.value, rateUnitOf(a.timeUnit), 's^-1'),
    band,
  });
}

/** The runs as checked: each analysed, and one whose times cannot be in their declared unit read in the unit meant. */
export interface RunsAsMeant {
  runs: SubmittedRun[];
  analyses: Array<RunAnalysis | UnfittedRun>;
  drafts: DraftFinding[];
}

export function analyseRunsAsMeant(runs: SubmittedRun[], settings: Settings): RunsAsMeant {
  const asMeant = [...runs];
  const drafts: DraftFinding[] = [];
  const analyses = runs.map((run, i) => {
    const a = analyseRun(run, i, settings.fitModel);
    const implausible = isFitted(a) ? runTimeUnitImplausible(a, settings) : undefined;
    if (!implausible) return a;
    drafts.push(implausible.draft);
    asMeant[i] = { ...run, timeUnit: implausible.meant };
    return analyseRun(asMeant[i], i, settings.fitModel);
  });
  return { runs: asMeant, analyses, drafts };
}
