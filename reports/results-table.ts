import type { CheckResult } from '../schemas/result.ts';
import { terminalMessage } from './format.ts';
import { severityCounts } from './result-summary.ts';

/**
 * One submission's part of the table: its row, aligned with every other row at the end, and its
 * findings or reasons for rejection as the text printed after the rows (aligned among themselves, so
 * made at once: a course's 20,000 entries need not hold their findings in memory until the end).
 */
export interface TableEntry {
  row: string[];
  details: string;
}

export const TABLE_HEADING = ['student', 'score', 'errors', 'warnings', 'info', 'codes'];

export function tableEntry(r: CheckResult): TableEntry {
  const counts = severityCounts(r.findings);
  const id = r.studentId ?? '(no id)';
  const details = [...r.findings.map((f) => [f.severity, f.path, terminalMessage(f.message)]), ...(r.rejected ?? []).map((x) => ['rejected', x.path, terminalMessage(x.message)])];
  return {
    row: [
      id,
      r.status === 'rejected' ? 'rejected' : `${points(r.score ?? 0)}/${points(r.maxScore)}`,
      String(counts.errors),
      String(counts.warnings),
      String(counts.infos),
      [...new Set(r.findings.map((f) => f.code))].join(', '),
    ],
    details: details.length === 0 ? '' : `\n\n${id}${alignColumns(details).map((line) => `\n  ${line}`).join('')}`,
  };
}

/**
 * The table's heading and rows, one per submission. The table printed is these, then each entry's
 * details in the same order (a blank line, the student, the findings one per line), then a line break.
 */
export function renderTableRows(rows: string[][]): string {
  return alignColumns([TABLE_HEADING, ...rows]).join('\n');
}

function points(value: number): string {
  return String(Number(value.toFixed(2)));
}

function alignColumns(rows: string[][]): string[] {
  const widths = rows[0].map((_, i) => rows.reduce((w, row) => Math.max(w, row[i].length), 0));
  return rows.map((row) => row.map((cell, i) => cell.padEnd(widths[i])).join('  ').trimEnd());
}
