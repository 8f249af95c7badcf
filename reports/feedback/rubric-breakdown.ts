import type { Settings, Submission } from '../../schemas/kinds/first-order-catalysis.ts';
import type { CheckResult } from '../../schemas/result.ts';

/**
 * The score taken apart by rubric item: what each item is worth for this submission (the checker's
 * maxScore rule) and the points its findings cost. An item never loses more than it is worth.
 */
export interface RubricLine {
  item: string;
  /** With sub/superscript markup. */
  label: string;
  /** Runs the item counts once for; 1 for the rate-law and presentation items. */
  count: number;
  each: number;
  available: number;
  lost: number;
  earned: number;
}

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
  const items: Array<[RubricItem, number]> = result.items
    ? result.items.map((c) => [c.item as RubricItem, c.count])
    : itemsOfOlderResult(settings, submission?.runs.length ?? 0);

  const lostBy = new Map<string, number>();
  for (const f of result.findings) {
    if (f.pointsLost > 0) lostBy.set(f.rubricItem ?? '', (lostBy.get(f.rubricItem ?? '') ?? 0) + f.pointsLost);
  }
  const lines: RubricLine[] = items
    .filter(([item]) => r[item] > 0 || (lostBy.get(item) ?? 0) > 0)
    .map(([item, count]) => {
      const available = r[item] * count;
      const lost = Math.min(available, lostBy.get(item) ?? 0);
      return { item, label: RUBRIC_LABELS[item], count, each: r[item], available, lost, earned: available - lost };
    });
  for (const [item, lost] of lostBy) {
    if (!items.some(([known]) => known === item)) {
      lines.push({ item, label: item === '' ? 'Other' : item, count: 1, each: 0, available: 0, lost, earned: 0 });
    }
  }
  return lines;
}

/** Rubric lines from the checker's own account of the maximum (`result.items`), with the kind's labels. */
export function rubricLinesOf(result: CheckResult, labels: Readonly<Record<string, string>>): RubricLine[] {
  const lostBy = new Map<string, number>();
  for (const f of result.findings) if (f.pointsLost > 0) lostBy.set(f.rubricItem ?? '', (lostBy.get(f.rubricItem ?? '') ?? 0) + f.pointsLost);
  return (result.items ?? []).map(({ item, count, each }) => {
    const available = each * count;
    const lost = Math.min(available, lostBy.get(item) ?? 0);
    return { item, label: labels[item] ?? item, count, each, available, lost, earned: available - lost };
  });
}
