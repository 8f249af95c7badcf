import type { CheckResult, Finding } from '../schemas/result.ts';

/** Per-result figures shared by the gradebook and the section summary. */
export interface SeverityCounts {
  errors: number;
  warnings: number;
  infos: number;
}

export function severityCounts(findings: readonly Finding[]): SeverityCounts {
  return {
    errors: findings.filter((f) => f.severity === 'error').length,
    warnings: findings.filter((f) => f.severity === 'warning').length,
    infos: findings.filter((f) => f.severity === 'info').length,
  };
}

/**
 * The codes of the error findings that cost points, each once, most costly first (points lost summed
 * over the code's findings); ties keep the order in which the codes first appear. An error that costs
 * nothing (a TA overrode it to 0, or its rubric item is worth 0) is still counted among the errors,
 * but is not what a student lost points for.
 */
export function mainErrorCodes(findings: readonly Finding[]): string[] {
  const cost = new Map<string, number>();
  for (const f of findings) {
    if (f.severity === 'error' && f.pointsLost > 0) cost.set(f.code, (cost.get(f.code) ?? 0) + f.pointsLost);
  }
  const order = [...cost.keys()];
  return order.sort((a, b) => cost.get(b)! - cost.get(a)! || order.indexOf(a) - order.indexOf(b));
}

/** Score as a fraction of the maximum; rejected results count as 0. */
export function scoreFraction(result: CheckResult): number {
  return result.status === 'checked' && result.maxScore > 0 ? (result.score ?? 0) / result.maxScore : 0;
}
