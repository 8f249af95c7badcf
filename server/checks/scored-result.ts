import type { CheckResult, Finding, RubricCount, Signal } from '../../schemas/result.ts';
import { settleBooks } from './rubric-books.ts';

/** The points the rubric items are worth in all. */
export function pointsOf(items: readonly RubricCount[]): number {
  return items.reduce((sum, c) => sum + c.count * c.each, 0);
}

/** A checked result: the maximum from the items, the score from the findings' points, kept by the books. */
export function scoredResult(studentId: string, items: RubricCount[], findings: Finding[], refit: CheckResult['refit'], signals: Signal[]): Omit<CheckResult, 'engineVersion'> {
  const books = settleBooks(items, pointsOf(items), findings);
  return { studentId, status: 'checked', score: books.score, maxScore: books.maxScore, items, refit, findings: books.findings, signals };
}
