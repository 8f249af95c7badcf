import { pointsOf } from '../../../server/checks/scored-result.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { convert } from '../../../server/engine/units.ts';
import type { Settings, Submission } from '../schemas.ts';
import type { RubricCount } from '../../../schemas/result.ts';
import type { EquilibriumItems } from './check-equilibrium.ts';

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

/** Items a submission cannot be graded on, found while checking it. */
export interface Ungradable {
  /** Runs whose k_obs these data do not determine: their k and its uncertainty are not graded. */
  kRuns?: number;
  /** Runs (by index) whose data give no fit: their ln F column, k and its uncertainty are not graded. */
  unfittedRuns?: number[];
  /** The rate law could not be refitted although the runs would allow it. */
  rateLaw?: boolean;
}

/**
 * What the maximum is made of. Per run: readings (with a class dataset), the ln F column (only for a
 * run with x_inf: without it there is no column to make), k and its uncertainty; then the rate law (three
 * runs at two concentrations or more) and presentation. Items that cannot be graded are left out.
 */
export function rubricCounts(settings: Settings, submission: Submission, ungradable: Ungradable = {}, equilibrium?: EquilibriumItems): RubricCount[] {
  const r = settings.rubric;
  const runs = submission.runs.length;
  const unfitted = new Set(ungradable.unfittedRuns ?? []);
  const kRuns = runs - (ungradable.kRuns ?? 0) - unfitted.size;
  const rateLaw = rateLawGradable(submission) && !ungradable.rateLaw ? 1 : 0;
  const counts: Array<[keyof Settings['rubric'], number]> = [
    ['readings', settings.classDataset ? runs : 0],
    ['lnF', submission.runs.filter((run, i) => run.infinity !== undefined && !unfitted.has(i)).length],
    ['k', kRuns],
    ['kUncertainty', kRuns],
    ['kN', rateLaw],
    ['kNUncertainty', rateLaw],
    ['kA', rateLaw],
    ['kAUncertainty', rateLaw],
    ['sigFigs', 1],
  ];
  const main = counts.filter(([item, count]) => count > 0 && r[item] > 0).map(([item, count]) => ({ item, count, each: r[item] }));
  return [...main, ...equilibriumCounts(settings, submission, equilibrium)];
}

/**
 * The equilibrium block's items, where it is set: per run with a K of ours its composition and K, and
 * the split of k where the run has a k_obs of ours; the mean K and the split of k_N and k_A once. Before
 * a check has said which runs give a K (a refused submission), every run with x_inf is counted.
 */
function equilibriumCounts(settings: Settings, submission: Submission, checked: EquilibriumItems | undefined): RubricCount[] {
  const block = settings.equilibrium;
  if (!block) return [];
  const withEnd = submission.runs.filter((run) => run.infinity !== undefined).length;
  const items = checked ?? { runsWithK: withEnd, runsWithSplit: withEnd, meanK: withEnd > 0, rateLawSplit: withEnd > 0 && rateLawGradable(submission) };
  const r = block.rubric;
  const counts: Array<[keyof typeof r, number]> = [
    ['composition', items.runsWithK],
    ['constant', items.runsWithK],
    ['kSplit', items.runsWithSplit],
    ['meanK', items.meanK ? 1 : 0],
    ['rateLawSplit', items.rateLawSplit ? 1 : 0],
  ];
  return counts.filter(([item, count]) => count > 0 && r[item] > 0).map(([item, count]) => ({ item, count, each: r[item] }));
}

/** The points the items are worth together. */
export function maxScore(settings: Settings, submission: Submission, ungradable?: Ungradable): number {
  return pointsOf(rubricCounts(settings, submission, ungradable));
}
