import type { CheckResult, Finding, RubricCount, Signal } from '../../schemas/result.ts';
import { settleBooks } from './rubric-books.ts';

/** The points the rubric items are worth in all. */
export function pointsOf(items: readonly RubricCount[]): number {
  return items.reduce((sum, c) => sum + c.count * c.each, 0);
}

/** What one instance of a rubric item is worth: `k@runs[2]` is the item `k` once, for one run. */
export function itemPoints(rubric: Readonly<Record<string, number>>, itemKey: string): number {
  return rubric[itemKey.split('@')[0]] ?? 0;
}

/** A checked result: the maximum from the items, the score from the findings' points, kept by the books. */
export function scoredResult(studentId: string, items: RubricCount[], findings: Finding[], refit: CheckResult['refit'], signals: Signal[]): Omit<CheckResult, 'engineVersion'> {
  const books = settleBooks(items, pointsOf(items), findings);
  return { studentId, status: 'checked', score: books.score, maxScore: books.maxScore, items, refit, findings: books.findings, signals };
}
