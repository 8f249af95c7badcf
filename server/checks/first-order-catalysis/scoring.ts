import { EngineError } from '../../engine/engine-error.ts';
import { convert } from '../../engine/units.ts';
import type { Settings, Submission } from '../../../schemas/kinds/first-order-catalysis.ts';

/** The points a rubric item instance is worth: `k@runs[2]` is worth rubric.k. */
export function itemPoints(settings: Settings, itemKey: string): number {
  const item = itemKey.split('@')[0] as keyof Settings['rubric'];
  return settings.rubric[item] ?? 0;
}

/** A straight line through k_obs against [catalyst] needs three runs at two concentrations or more. */
export function rateLawGradable(submission: Submission): boolean {
  const inM = submission.runs.map((run) => {
    try {
      return convert(run.catalyst.value, run.catalyst.unit, 'M');
    } catch (error) {
      if (error instanceof EngineError) return Number.NaN;
      throw error;
    }
  });
  return submission.runs.length >= 3 && new Set(inM).size >= 2;
}

/** Per run: readings (with a class dataset), ln F, k and its uncertainty; then the rate law and presentation. */
export function maxScore(settings: Settings, submission: Submission): number {
  const r = settings.rubric;
  const perRun = (settings.classDataset ? r.readings : 0) + r.lnF + r.k + r.kUncertainty;
  const rateLaw = rateLawGradable(submission) ? r.kN + r.kNUncertainty + r.kA + r.kAUncertainty : 0;
  return perRun * submission.runs.length + rateLaw + r.sigFigs;
}
