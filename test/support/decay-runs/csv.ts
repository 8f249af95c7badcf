import type { CsvLayout, CsvRowError } from '../../../server/input/csv-layout.ts';
import { numberOrText, readTable } from '../../../server/input/csv-table.ts';

const COLUMNS = ['student_id', 'run', 'time_unit', 'infinity', 't', 'x', 'reported_k'];
// Written once a run in the schema: every row of a run must give the same.
const PER_RUN = ['time_unit', 'infinity', 'reported_k'];

/** One file, `readings`: a row a reading, the run's unit, end value and reported k repeated on each of its rows. */
export const decayRunsCsv: CsvLayout = {
  main: 'readings',
  optional: [],
  async read(files) {
    const table = readTable(files.readings, COLUMNS);
    const rowErrors: CsvRowError[] = table.errors.map((e) => ({ file: 'readings', ...e }));
    const value = (text: string) => numberOrText(text, table.decimalComma);
    const submissions: Array<{ studentId: string; runs: Array<Record<string, unknown> & { readings: unknown[] }> }> = [];
    const lines: number[] = [];
    const firstOfRun = new Map<string, (column: string) => string>();
    for (const row of table.rows) {
      const studentId = row.cell('student_id');
      let submission = submissions.at(-1);
      if (submission?.studentId !== studentId) {
        submission = { studentId, runs: [] };
        submissions.push(submission);
        lines.push(row.line);
      }
      const label = row.cell('run');
      let run = submission.runs.at(-1);
      if (run?.label !== label) {
        run = { label, timeUnit: row.cell('time_unit'), infinity: value(row.cell('infinity')), readings: [], reported: { k: { value: value(row.cell('reported_k')) } } };
        submission.runs.push(run);
        firstOfRun.set(`${studentId}\u0000${label}`, row.cell);
      }
      const first = firstOfRun.get(`${studentId}\u0000${label}`)!;
      for (const column of PER_RUN) if (row.cell(column) !== first(column)) rowErrors.push({ file: 'readings', row: row.line, message: `${column} differs from the run's first row (${first(column)})` });
      run.readings.push([value(row.cell('t')), value(row.cell('x'))]);
    }
    return { submissions, lines, rowErrors };
  },
};
