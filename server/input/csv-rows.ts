import type { CsvRowError } from './csv-layout.ts';
import { readTable, type Row } from './csv-table.ts';

/** One file of an upload: its field name, text, required columns, and what files each row (a message when the row is wrong). */
export interface CsvFile {
  file: string;
  text: string;
  columns: string[];
  add: (row: Row, decimalComma: boolean) => string | undefined;
}

export interface FiledRows {
  /** The 1-based line each student id first appears on in the main file. */
  firstLine: Map<string, number>;
  rowErrors: CsvRowError[];
  /** Whether the main file writes decimals with a comma. */
  decimalComma: boolean;
}

/**
 * Files every row of the main file, then of the reported-values file where there is one, in the
 * order written: each row's problem is kept with its file and line, and each student's first line in
 * the main file is noted, for the upload's `lines`.
 */
export function fileRows(main: CsvFile, reported?: CsvFile): FiledRows {
  const firstLine = new Map<string, number>();
  const rowErrors: CsvRowError[] = [];
  const file = (source: CsvFile, onRow?: (row: Row) => void): boolean => {
    const table = readTable(source.text, source.columns);
    rowErrors.push(...table.errors.map((e) => ({ file: source.file, ...e })));
    for (const row of table.rows) {
      onRow?.(row);
      const error = source.add(row, table.decimalComma);
      if (error) rowErrors.push({ file: source.file, row: row.line, message: error });
    }
    return table.decimalComma;
  };
  const decimalComma = file(main, (row) => {
    if (!firstLine.has(row.cell('student_id'))) firstLine.set(row.cell('student_id'), row.line);
  });
  if (reported) file(reported);
  return { firstLine, rowErrors, decimalComma };
}
