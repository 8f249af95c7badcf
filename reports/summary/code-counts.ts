import type { CheckResult } from '../../schemas/result.ts';

export interface CodeCount {
  code: string;
  /** Students with at least one finding of this code (as its code or among alsoCodes). */
  students: number;
  /** Of those, students for whom it was an error. */
  asError: number;
}

/** How many students each finding code occurred for, counted one result at a time. */
export class CodeTally {
  private readonly students = new Map<string, number>();
  private readonly asError = new Map<string, number>();

  add(result: CheckResult): void {
    const codes = new Set(result.findings.flatMap((f) => [f.code, ...(f.alsoCodes ?? [])]));
    const errors = new Set(result.findings.filter((f) => f.severity === 'error').flatMap((f) => [f.code, ...(f.alsoCodes ?? [])]));
    for (const c of codes) this.students.set(c, (this.students.get(c) ?? 0) + 1);
    for (const c of errors) this.asError.set(c, (this.asError.get(c) ?? 0) + 1);
  }

  /** Most frequent first (ties in `order`, the kind's list, then as first met). */
  counts(order: readonly string[] = []): CodeCount[] {
    const rank = (code: string) => {
      const i = order.indexOf(code);
      return i === -1 ? order.length : i;
    };
    return [...this.students.entries()]
      .map(([code, n]) => ({ code, students: n, asError: this.asError.get(code) ?? 0 }))
      .sort((a, b) => b.students - a.students || rank(a.code) - rank(b.code));
  }
}

export function codeCounts(results: readonly CheckResult[], order: readonly string[] = []): CodeCount[] {
  const tally = new CodeTally();
  for (const result of results) tally.add(result);
  return tally.counts(order);
}
