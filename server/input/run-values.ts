import { numberOrText, type Row } from './csv-table.ts';

/** A run's value as first written, with its line: the run's later rows must agree with it. */
export type RunValues<Column extends string> = Map<Column, { text: string; line: number }>;

/**
 * Keeps each run-wide column's first value and compares later rows with it (as numbers where they are
 * numbers, so 0.10 and 0.1 agree). A run's values repeat on every row of a long CSV, and a row that
 * disagrees is a typing slip the TA should see, not a value to pick silently.
 */
export function keepRunValues<Column extends string>(values: RunValues<Column>, columns: readonly Column[], row: Row, decimalComma: boolean, where: string): string | undefined {
  const conflicts: string[] = [];
  for (const column of columns) {
    const text = row.cell(column);
    if (text === '') continue;
    const earlier = values.get(column);
    if (!earlier) values.set(column, { text, line: row.line });
    else if (numberOrText(earlier.text, decimalComma) !== numberOrText(text, decimalComma)) conflicts.push(`${column} is ${earlier.text} on line ${earlier.line} but ${text} on line ${row.line}`);
  }
  return conflicts.length > 0 ? `${where}: ${conflicts.join('; ')}` : undefined;
}
