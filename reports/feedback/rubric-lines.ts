import type { CheckResult } from '../../schemas/result.ts';
import { OFF_THE_SCORE, settleBooks, type RubricRow } from '../../server/checks/rubric-books.ts';

/**
 * The score taken apart by rubric item: the books' rows (what each item is worth for this submission
 * and the points its findings cost, never more than it is worth) with the item's label.
 */
export interface RubricLine extends RubricRow {
  /** With sub/superscript markup. */
  label: string;
}

export function labelled(rows: RubricRow[], labels: Readonly<Record<string, string>>): RubricLine[] {
  return rows.map((row) => ({ ...row, label: labels[row.item] ?? (row.item === OFF_THE_SCORE ? 'Late work, off the score' : row.item) }));
}

/** Rubric lines from the checker's own account of the maximum (`result.items`), with the kind's labels. */
export function rubricLinesOf(result: CheckResult, labels: Readonly<Record<string, string>>): RubricLine[] {
  return labelled(settleBooks(result.items ?? [], result.maxScore, result.findings).rows, labels);
}
