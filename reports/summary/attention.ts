import type { CheckResult } from '../../schemas/result.ts';
import { formatPoints } from '../format.ts';
import { mainErrorCodes, scoreFraction, severityCounts } from '../result-summary.ts';

/**
 * The students who most need a TA's attention: rejected submissions first, then the lowest share of
 * the points, then the most errors. Students with full points and no error are never listed.
 */
export function needAttention(results: readonly CheckResult[], limit = 12): CheckResult[] {
  const errors = (r: CheckResult) => severityCounts(r.findings).errors;
  return results
    .filter((r) => r.status === 'rejected' || scoreFraction(r) < 1 || errors(r) > 0)
    .map((r, i) => ({ r, i }))
    .sort(
      (a, b) =>
        Number(b.r.status === 'rejected') - Number(a.r.status === 'rejected') ||
        scoreFraction(a.r) - scoreFraction(b.r) ||
        errors(b.r) - errors(a.r) ||
        a.i - b.i,
    )
    .slice(0, limit)
    .map(({ r }) => r);
}

export function attentionRow(r: CheckResult): string[] {
  const counts = severityCounts(r.findings);
  return [
    r.studentId ?? '(no id)',
    r.status === 'rejected' ? 'not checked' : `${formatPoints(r.score ?? 0)} / ${formatPoints(r.maxScore)}`,
    String(counts.errors),
    String(counts.warnings),
    r.status === 'rejected' ? `rejected: ${(r.rejected ?? []).length} problem(s)` : mainErrorCodes(r.findings).join(', ') || '—',
  ];
}
