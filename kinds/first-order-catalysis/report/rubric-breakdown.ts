import type { Settings, Submission } from '../schemas.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { settleBooks } from '../../../server/checks/rubric-books.ts';
import { labelled, type RubricLine } from '../../../reports/feedback/rubric-lines.ts';

type RubricItem = keyof Settings['rubric'];

export const RUBRIC_LABELS: Record<RubricItem, string> = {
  readings: 'Readings match the class data',
  lnF: 'ln F column',
  k: 'k_{obs}',
  kUncertainty: 'Standard error of k_{obs}',
  kN: 'k_{N}',
  kNUncertainty: 'Standard error of k_{N}',
  kA: 'k_{A}',
  kAUncertainty: 'Standard error of k_{A}',
  sigFigs: 'Significant figures',
};

/** The equilibrium block's items (only with the block in the settings). */
export const EQUILIBRIUM_RUBRIC_LABELS: Record<keyof NonNullable<Settings['equilibrium']>['rubric'], string> = {
  composition: 'Equilibrium composition [α]_{eq}, x_{B}',
  constant: 'Equilibrium constant K',
  kSplit: 'k_{f} and k_{r}',
  meanK: 'Mean K',
  rateLawSplit: 'k_{N} and k_{A} split into forward and reverse',
};

/** The items of a result stored before results said what their maximum was made of. */
function itemsOfOlderResult(settings: Settings, runs: number): Array<[RubricItem, number]> {
  const items: Array<[RubricItem, number]> = [];
  if (settings.classDataset) items.push(['readings', runs]);
  items.push(['lnF', runs], ['k', runs], ['kUncertainty', runs]);
  if (runs >= 3) items.push(['kN', 1], ['kNUncertainty', 1], ['kA', 1], ['kAUncertainty', 1]);
  if (settings.rubric.sigFigs > 0) items.push(['sigFigs', 1]);
  return items;
}

export function rubricBreakdown(settings: Settings, submission: Pick<Submission, 'runs'> | undefined, result: CheckResult): RubricLine[] {
  const r = settings.rubric;
  // The checker says what the maximum is made of; older results are read by the rule of their time.
  const items = result.items ?? itemsOfOlderResult(settings, submission?.runs.length ?? 0).map(([item, count]) => ({ item, count, each: r[item] }));
  return labelled(settleBooks(items, result.maxScore, result.findings).rows, { ...RUBRIC_LABELS, ...EQUILIBRIUM_RUBRIC_LABELS }).filter((l) => l.each > 0 || l.lost > 0);
}
