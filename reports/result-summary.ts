import type { CheckResult, Finding } from '../schemas/result.ts';
import { cardCounts } from './feedback/finding-groups.ts';

/** Each finding counted by its severity: the terminal table, which lists every finding on its own line. */
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
 * A result's findings counted the way the feedback sheet groups them (`cardCounts`), shared by the
 * results page, the gradebook and the section summary: one per likely cause that costs points (a slip
 * repeated in four values, charged once, counts once); the warnings and notes that cost nothing, one
 * per card; values that merely follow from the student's own numbers are notes. An error a TA forgave
 * to 0 is in none of them: it cost nothing and the sheet shows it apart.
 */
export interface CauseCounts {
  costingPoints: number;
  warnings: number;
  notes: number;
}

export function causeCounts(findings: readonly Finding[]): CauseCounts {
  const counts = cardCounts(findings);
  return { costingPoints: counts.costPoints, warnings: counts.warnings, notes: counts.notes };
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
