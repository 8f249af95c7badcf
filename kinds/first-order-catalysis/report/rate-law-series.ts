import type { Refit, Settings, Submission } from '../schemas.ts';
import { convertUnit } from '../../../reports/units.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';

/**
 * What the k_obs against [catalyst] plot shows, all in the instructor's units with [catalyst] in M:
 * our k_obs with their standard errors, the student's reported k_obs, our line (refit k_N, k_A) and the
 * student's line (their k_N, k_A).
 */
export interface RateLawSeries {
  kUnit: string;
  ours: Array<{ c: number; k: number; se: number }>;
  theirs: Array<{ c: number; k: number }>;
  ourLine?: Line;
  theirLine?: Line;
  notes: string[];
}

function within(tolerance: Settings['tolerances']['kN'], value: number, reference: number): boolean {
  return Math.abs(value - reference) <= Math.max((tolerance.relative ?? 0) * Math.abs(reference), tolerance.absolute ?? 0);
}

export function rateLawSeries(settings: Settings, submission: Submission, refit: Refit): RateLawSeries | undefined {
  const kUnit = settings.units.k;
  const kAUnit = `M^-1 ${kUnit}`;
  const notes: string[] = [];
  const ours: RateLawSeries['ours'] = [];
  const theirs: RateLawSeries['theirs'] = [];
  refit.runs.forEach((run, i) => {
    const data = submission.runs[i];
    const c = data ? convertUnit(data.catalyst.value, data.catalyst.unit, 'M') : undefined;
    if (c === undefined) return;
    // A run that could not be fitted has no k of ours; the student's is still drawn.
    const estimate = run.k?.instructor;
    const k = estimate && convertUnit(estimate.value, estimate.unit, kUnit);
    const se = estimate && convertUnit(estimate.standardError, estimate.unit, kUnit);
    if (k !== undefined && se !== undefined) ours.push({ c, k, se });
    const reported = data?.reported?.k;
    if (reported) {
      const theirK = convertUnit(Number(reported.value), reported.unit, kUnit);
      if (theirK !== undefined) theirs.push({ c, k: theirK });
    }
  });
  if (ours.length < 2) return undefined;

  const line = (kN: { value: number; unit: string } | undefined, kA: { value: number; unit: string } | undefined): Line | undefined => {
    if (!kN || !kA) return undefined;
    const intercept = convertUnit(kN.value, kN.unit, kUnit);
    const slope = convertUnit(kA.value, kA.unit, kAUnit);
    return intercept === undefined || slope === undefined ? undefined : { intercept, slope };
  };
  const ourLine = line(refit.kN, refit.kA);
  const reported = submission.reported;
  let theirLine = line(
    reported?.kN && { value: Number(reported.kN.value), unit: reported.kN.unit },
    reported?.kA && { value: Number(reported.kA.value), unit: reported.kA.unit },
  );
  if (reported?.kN && reported?.kA && !theirLine) notes.push('Your line is not drawn: the unit of your k_{N} or k_{A} could not be read here.');
  if (!reported?.kN || !reported?.kA) notes.push('Your line is not drawn: k_{N} or k_{A} was not reported.');
  if (theirLine && ourLine && within(settings.tolerances.kN, theirLine.intercept, ourLine.intercept) && within(settings.tolerances.kA, theirLine.slope, ourLine.slope)) {
    theirLine = undefined;
    notes.push('Your k_{N} and k_{A} agree with the refit within the tolerances: your line lies on the refit line.');
  }
  return { kUnit, ours, theirs, ourLine, theirLine, notes };
}
