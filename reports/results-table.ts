import type { CheckResult } from '../schemas/result.ts';
import { terminalMessage } from './format.ts';
import { severityCounts } from './result-summary.ts';

/** One submission's part of the table: its row, then its findings or reasons for rejection. */
export interface TableEntry {
  row: string[];
  details: string[][];
}

export const TABLE_HEADING = ['student', 'score', 'errors', 'warnings', 'info', 'codes'];

export function tableEntry(r: CheckResult): TableEntry {
  const counts = severityCounts(r.findings);
  return {
    row: [
      r.studentId ?? '(no id)',
      r.status === 'rejected' ? 'rejected' : `${points(r.score ?? 0)}/${points(r.maxScore)}`,
      String(counts.errors),
      String(counts.warnings),
      String(counts.infos),
      [...new Set(r.findings.map((f) => f.code))].join(', '),
    ],
    details: [...r.findings.map((f) => [f.severity, f.path, terminalMessage(f.message)]), ...(r.rejected ?? []).map((x) => ['rejected', x.path, terminalMessage(x.message)])],
  };
}

/** One row per submission, then each submission's findings (or reasons for rejection), one per line. */
export function renderTable(entries: TableEntry[]): string {
  const lines = alignColumns([TABLE_HEADING, ...entries.map((e) => e.row)]);
  for (const { row, details } of entries) {
    if (details.length === 0) continue;
    lines.push('', row[0], ...alignColumns(details).map((line) => `  ${line}`));
  }
  return `${lines.join('\n')}\n`;
}

function points(value: number): string {
  return String(Number(value.toFixed(2)));
}

function alignColumns(rows: string[][]): string[] {
  const widths = rows[0].map((_, i) => rows.reduce((w, row) => Math.max(w, row[i].length), 0));
  return rows.map((row) => row.map((cell, i) => cell.padEnd(widths[i])).join('  ').trimEnd());
}
