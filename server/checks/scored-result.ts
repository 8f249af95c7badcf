import type { CheckResult, Finding, RubricCount, Signal } from '../../schemas/result.ts';

/** The points the rubric items are worth in all. */
export function pointsOf(items: readonly RubricCount[]): number {
  return items.reduce((sum, c) => sum + c.count * c.each, 0);
}

/** A checked result: the maximum from the items, the score from the findings' points (never below zero). */
export function scoredResult(studentId: string, items: RubricCount[], findings: Finding[], refit: CheckResult['refit'], signals: Signal[]): Omit<CheckResult, 'engineVersion'> {
  const max = pointsOf(items);
  const lost = findings.reduce((sum, f) => sum + f.pointsLost, 0);
  return { studentId, status: 'checked', score: Math.max(0, max - lost), maxScore: max, items, refit, findings, signals };
}
