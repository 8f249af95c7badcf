import type { Info } from 'csv-parse/sync';
import { parse } from 'csv-parse/sync';
import type { CsvRowError } from './csv-layout.ts';

/**
 * One CSV file of a layout read as a table: the delimiter guessed from the header (`;` or `,`),
 * columns by lower-case name, each data row with its line number. Values stay text; a kind's layout
 * makes submissions of them.
 */
export type LineError = Omit<CsvRowError, 'file'>;

// The same grammar as NumberLike in schemas/common.ts, after a decimal comma has become a point.
const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

export interface Row {
  line: number;
  /** The trimmed cell, '' when blank or when the column is absent. */
  cell(column: string): string;
}

export interface Table {
  rows: Row[];
  /** Only a `;`-separated file may write 0,052 for 0.052: in a comma file the comma splits fields. */
  decimalComma: boolean;
  errors: LineError[];
}

export function readTable(text: string, required: string[]): Table {
  const body = text.replace(/^\uFEFF/, '');
  const headerLine = body.split(/\r?\n/).find((line) => line.trim() !== '');
  if (headerLine === undefined) return { rows: [], decimalComma: false, errors: [{ row: 1, message: 'the file is empty' }] };
  const delimiter = delimiterOf(headerLine);

  let records: Array<{ record: string[]; info: Info }>;
  try {
    // The typings do not model `info: true`, which wraps each record with its line number.
    records = parse(body, {
      delimiter,
      info: true,
      trim: true,
      relax_column_count: true,
      skip_empty_lines: true,
      // Spreadsheets export trailing rows of bare delimiters.
      skip_records_with_empty_values: true,
    }) as unknown as typeof records;
  } catch (error) {
    return { rows: [], decimalComma: false, errors: [{ row: (error as { lines?: number }).lines ?? 1, message: (error as Error).message }] };
  }

  const [header, ...data] = records;
  const names = header.record.map((name) => name.toLowerCase());
  const errors: LineError[] = [];
  names.forEach((name, i) => {
    if (name !== '' && names.indexOf(name) !== i) errors.push({ row: header.info.lines, message: `column "${name}" appears twice` });
  });
  for (const name of required) {
    if (!names.includes(name)) errors.push({ row: header.info.lines, message: `missing column "${name}"` });
  }
  if (errors.length > 0) return { rows: [], decimalComma: false, errors };
  if (data.length === 0) return { rows: [], decimalComma: false, errors: [{ row: header.info.lines + 1, message: 'no rows below the header' }] };

  const rows: Row[] = [];
  for (const { record, info } of data) {
    if (record.length !== names.length) {
      errors.push({ row: info.lines, message: `${record.length} fields where the header has ${names.length}` });
      continue;
    }
    rows.push({ line: info.lines, cell: (column) => record[names.indexOf(column)] ?? '' });
  }
  return { rows, decimalComma: delimiter === ';', errors };
}

function count(text: string, char: string): number {
  return text.split(char).length - 1;
}

/** A file's delimiter, guessed from its header line: `;` where it has more of them than commas. */
export function delimiterOf(headerLine: string): ';' | ',' {
  return count(headerLine, ';') > count(headerLine, ',') ? ';' : ',';
}

export function numberText(text: string, decimalComma: boolean): string {
  return decimalComma ? text.replace(',', '.') : text;
}

/** A number, or the text as written so that the schema rejects it at its path. */
export function numberOrText(text: string, decimalComma: boolean): number | string {
  const normal = numberText(text, decimalComma);
  return NUMBER.test(normal) ? Number(normal) : text;
}
