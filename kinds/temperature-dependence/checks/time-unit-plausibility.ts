import type { Settings, Submission } from '../schemas.ts';
import { GAS_CONSTANT } from '../../../server/engine/physical-constants.ts';
import { convert, parseUnit } from '../../../server/engine/units.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { inKelvin } from '../../../server/checks/temperature-plausibility.ts';
import { timeUnitImplausible, type ImplausibleTimes } from '../../../server/checks/time-unit-plausibility.ts';
import { analyseTemperatures, type TemperatureAnalysis } from './refit.ts';

/**
 * The k the reference bands of E_a and A allow at temperature T, per second: from the smallest A with
 * the largest E_a to the largest A with the smallest (k = A e^(-E_a/RT), Arrhenius); undefined
 * without both bands.
 */
function bandAt(settings: Settings, kelvin: number): [number, number] | undefined {
  const { Ea, A } = settings.reference ?? {};
  if (!Ea || !A) return undefined;
  const joules = (v: number) => convert(v, Ea.unit, 'J mol^-1');
  const perSecond = (v: number) => convert(v, A.unit, 's^-1');
  const k = (a: number, e: number) => perSecond(a) * Math.exp(-joules(e) / (GAS_CONSTANT * kelvin));
  return [k(A.min, Ea.max), k(A.max, Ea.min)];
}

/** Each point given as a run whose times cannot fit their declared unit, judged by the bands of E_a and A. */
function implausibleRunTimes(submission: Submission, analysis: TemperatureAnalysis, settings: Settings): Array<ImplausibleTimes & { index: number }> {
  return analysis.runs.flatMap((run) => {
    const point = analysis.points[analysis.pointIndex.indexOf(run.index)];
    const band = bandAt(settings, point.temperature);
    const input = submission.points[run.index];
    if (!band || !input.run) return [];
    const found = timeUnitImplausible({
      path: `points[${run.index}].run.timeUnit`,
      stage: 'runs',
      what: `the run at ${input.label}`,
      where: `at ${inKelvin(point.temperature)} K`,
      timeUnit: parseUnit(input.run.timeUnit, 'time'),
      kPerSecond: point.k,
      band,
    });
    return found ? [{ ...found, index: run.index }] : [];
  });
}

/** The submission as checked: a run whose times cannot be in their declared unit read in the unit meant, and the findings that say so. */
export function analyseAsMeant(settings: Settings, submitted: Submission): { submission: Submission; analysis: TemperatureAnalysis; drafts: DraftFinding[] } {
  const analysis = analyseTemperatures(settings, submitted.points);
  const implausible = implausibleRunTimes(submitted, analysis, settings);
  if (implausible.length === 0) return { submission: submitted, analysis, drafts: [] };
  const points = submitted.points.map((p, i) => {
    const meant = implausible.find((found) => found.index === i)?.meant;
    return meant && p.run ? { ...p, run: { ...p.run, timeUnit: meant } } : p;
  });
  const submission = { ...submitted, points };
  return { submission, analysis: analyseTemperatures(settings, points), drafts: implausible.map((found) => found.draft) };
}
