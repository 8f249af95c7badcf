import { readFile } from 'node:fs/promises';

/**
 * One student's lines of an example CSV file of the first kind (docs/examples/readings.csv or
 * reported.csv), as a student would copy them from their spreadsheet: the header line first, the
 * student_id column left out. The example files hold no quoted cells, so a comma always separates.
 */
export async function exampleRowsOf(file: 'readings.csv' | 'reported.csv', studentId: string): Promise<string[][]> {
  const rows = (await readFile(new URL(`../../docs/examples/${file}`, import.meta.url), 'utf8')).trim().split('\n').map((line) => line.split(','));
  return [rows[0].slice(1), ...rows.filter((r) => r[0] === studentId).map((r) => r.slice(1))];
}
