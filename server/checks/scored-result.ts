import type { CheckResult, Finding, RubricCount, Signal } from '../../schemas/result.ts';

/** The points the rubric items are worth in all. */
export function pointsOf(items: readonly RubricCount[]): number {
  return items.reduce((sum, c) => sum + c.count * c.each, 0);
}

/** What one instance of a rubric item is worth: `k@runs[2]` is the item `k` once, for one run. */
export function itemPoints(rubric: Readonly<Record<string, number>>, itemKey: string): number {
  return rubric[itemKey.split('@')[0]] ?? 0;
}

/** A checked result: the maximum from the items, the score from the findings' points (never below zero). */
export function scoredResult(studentId: string, items: RubricCount[], findings: Finding[], refit: CheckResult['refit'], signals: Signal[]): Omit<CheckResult, 'engineVersion'> {
  const max = pointsOf(items);
  const lost = findings.reduce((sum, f) => sum + f.pointsLost, 0);
  return { studentId, status: 'checked', score: Math.max(0, max - lost), maxScore: max, items, refit, findings, signals };
}
