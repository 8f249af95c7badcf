import type { CheckResult } from '../../schemas/result.ts';

/** The demo's table: per student the score, the slips the generator made, and the codes the checker found. */
export const TABLE_HEADER = 'student  score   slips made (generated)        codes found';

export function tableRows(results: CheckResult[], slipsMade: (studentId: string) => readonly string[]): string[] {
  return results.map((r) => {
    const codes = [...new Set(r.findings.filter((f) => f.severity !== 'info').map((f) => f.code))].join(', ') || '-';
    const made = slipsMade(r.studentId!).join(', ') || '-';
    return `${r.studentId!.padEnd(8)} ${`${r.score}/${r.maxScore}`.padEnd(7)} ${made.padEnd(29)} ${codes}`;
  });
}
