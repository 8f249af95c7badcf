import type { CheckResult } from '../../schemas/result.ts';

export interface CodeCount {
  code: string;
  /** Students with at least one finding of this code (as its code or among alsoCodes). */
  students: number;
  /** Of those, students for whom it was an error. */
  asError: number;
}

/** How many students each finding code occurred for, most frequent first (ties in `order`, the kind's list). */
export function codeCounts(results: readonly CheckResult[], order: readonly string[] = []): CodeCount[] {
  const students = new Map<string, number>();
  const asError = new Map<string, number>();
  for (const result of results) {
    const codes = new Set(result.findings.flatMap((f) => [f.code, ...(f.alsoCodes ?? [])]));
    const errors = new Set(result.findings.filter((f) => f.severity === 'error').flatMap((f) => [f.code, ...(f.alsoCodes ?? [])]));
    for (const c of codes) students.set(c, (students.get(c) ?? 0) + 1);
    for (const c of errors) asError.set(c, (asError.get(c) ?? 0) + 1);
  }
  const rank = (code: string) => {
    const i = order.indexOf(code);
    return i === -1 ? order.length : i;
  };
  return [...students.entries()]
    .map(([code, n]) => ({ code, students: n, asError: asError.get(code) ?? 0 }))
    .sort((a, b) => b.students - a.students || rank(a.code) - rank(b.code));
}
