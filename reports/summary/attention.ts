import type { CheckResult } from '../../schemas/result.ts';
import { formatPoints } from '../format.ts';
import { causeCounts, mainErrorCodes, scoreFraction } from '../result-summary.ts';

interface Ranked {
  result: CheckResult;
  rejected: boolean;
  fraction: number;
  costingPoints: number;
  index: number;
}

// Rejected first, then the lowest share of the points, then the most causes that cost points, then the order given.
const before = (a: Ranked, b: Ranked) => Number(b.rejected) - Number(a.rejected) || a.fraction - b.fraction || b.costingPoints - a.costingPoints || a.index - b.index;

/**
 * The students who most need a TA's attention, taken one result at a time: rejected submissions first,
 * then the lowest share of the points, then the most likely causes that cost points (counted as the
 * sheet and the results page count them, `causeCounts`). Students with full points and nothing that
 * cost points are never listed. Only the `limit` first so far are kept, so a section of any size costs the same.
 */
export class AttentionList {
  private readonly kept: Ranked[] = [];
  private seen = 0;

  constructor(private readonly limit = 12) {}

  add(result: CheckResult): void {
    const index = this.seen++;
    const ranked = { result, rejected: result.status === 'rejected', fraction: scoreFraction(result), costingPoints: causeCounts(result.findings).costingPoints, index };
    if (!(ranked.rejected || ranked.fraction < 1 || ranked.costingPoints > 0)) return;
    // Every key differs by its index, so inserting in place is the sort of the whole list cut to its first `limit`.
    let at = this.kept.length;
    while (at > 0 && before(ranked, this.kept[at - 1]) < 0) at--;
    if (at >= this.limit) return;
    this.kept.splice(at, 0, ranked);
    if (this.kept.length > this.limit) this.kept.pop();
  }

  list(): CheckResult[] {
    return this.kept.map((k) => k.result);
  }
}

export function needAttention(results: readonly CheckResult[], limit = 12): CheckResult[] {
  const list = new AttentionList(limit);
  for (const result of results) list.add(result);
  return list.list();
}

export function attentionRow(r: CheckResult): string[] {
  const counts = causeCounts(r.findings);
  return [
    r.studentId ?? '(no id)',
    r.status === 'rejected' ? 'not checked' : `${formatPoints(r.score ?? 0)} / ${formatPoints(r.maxScore)}`,
    String(counts.costingPoints),
    String(counts.warnings),
    r.status === 'rejected' ? `rejected: ${(r.rejected ?? []).length} problem(s)` : mainErrorCodes(r.findings).join(', ') || '—',
  ];
}
