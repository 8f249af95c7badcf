import type { CsvSubmissions } from '../../server/input/csv-layout.ts';
import { fileRows } from '../../server/input/csv-rows.ts';
import { keepRunValues, type RunValues } from '../../server/input/run-values.ts';
import { numberOrText, numberText, type Row } from '../../server/input/csv-table.ts';

/**
 * The CSV layout of `reaction-order` submissions: a readings file, one row per reading, and a
 * reported-values file. Text in, Submission-shaped plain objects out, no file I/O; values are passed
 * on as written for the schema to validate at their paths.
 * - Readings: `student_id, run, time_unit, t, signal` (the signal as the assignment names it:
 *   concentration, absorbance or conductance), optionally `initial_concentration` with
 *   `initial_concentration_unit`, given once per run or repeated.
 * - Reported: `student_id, quantity, value, unit` (optionally `uncertainty` and `run`); quantity
 *   `order` (unit left blank), `k`, or `half_life` with its run's label.
 * The reported file is needed for a submission to be checked (order and k are required), but the
 * readings file alone is read, so the schema names what is missing at its path.
 */
export const READINGS_COLUMNS = ['student_id', 'run', 'time_unit', 't', 'signal'];
export const REPORTED_COLUMNS = ['student_id', 'quantity', 'value', 'unit'];

/** Values that belong to a run rather than to a reading. */
const RUN_COLUMNS = ['time_unit', 'initial_concentration', 'initial_concentration_unit'] as const;
type RunColumn = (typeof RUN_COLUMNS)[number];

/** A reported value with its digits as written, so that significant figures survive. */
interface ReportedText {
  value: string;
  uncertainty?: string;
  unit: string;
}

interface RunDraft {
  label: string;
  values: RunValues<RunColumn>;
  readings: Array<[number | string, number | string]>;
  halfLife?: { value: ReportedText; line: number };
}

interface Draft {
  studentId: string;
  runs: Map<string, RunDraft>;
  order?: { value: number | string; line: number };
  k?: { value: ReportedText; line: number };
}

export function parseReactionOrderCsv(readingsText: string, reportedText?: string): CsvSubmissions {
  const drafts = new Map<string, Draft>();
  const { firstLine, rowErrors, decimalComma } = fileRows(
    { file: 'readings', text: readingsText, columns: READINGS_COLUMNS, add: (row, comma) => addReading(drafts, row, comma) },
    reportedText === undefined ? undefined : { file: 'reported', text: reportedText, columns: REPORTED_COLUMNS, add: (row, comma) => addReported(drafts, row, comma) },
  );
  return { submissions: [...drafts.values()].map((d) => toSubmission(d, decimalComma)), lines: [...drafts.keys()].map((id) => firstLine.get(id)!), rowErrors };
}

/** Files the row under its student and run; a message when the run's values disagree. */
function addReading(drafts: Map<string, Draft>, row: Row, decimalComma: boolean): string | undefined {
  const studentId = row.cell('student_id');
  const label = row.cell('run');
  const draft = drafts.get(studentId) ?? drafts.set(studentId, { studentId, runs: new Map() }).get(studentId)!;
  const run = draft.runs.get(label) ?? draft.runs.set(label, { label, values: new Map(), readings: [] }).get(label)!;
  run.readings.push([numberOrText(row.cell('t'), decimalComma), numberOrText(row.cell('signal'), decimalComma)]);
  return keepRunValues(run.values, RUN_COLUMNS, row, decimalComma, `run "${label}" of student "${studentId}"`);
}

function addReported(drafts: Map<string, Draft>, row: Row, decimalComma: boolean): string | undefined {
  const studentId = row.cell('student_id');
  const quantity = row.cell('quantity').toLowerCase().replace(/[\s-]/g, '_');
  const label = row.cell('run');
  const draft = drafts.get(studentId);
  if (!draft) return `no readings for student "${studentId}"`;
  const uncertainty = row.cell('uncertainty');
  const value: ReportedText = { value: numberText(row.cell('value'), decimalComma), ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, decimalComma) }), unit: row.cell('unit') };
  const already = (what: string, line: number) => `${what} of student "${studentId}" is already given on line ${line}`;
  switch (quantity) {
    case 'order':
      if (label !== '') return 'the order belongs to the whole submission: leave run blank';
      if (draft.order) return already('the order', draft.order.line);
      draft.order = { value: numberOrText(row.cell('value'), decimalComma), line: row.line };
      return undefined;
    case 'k':
      if (label !== '') return 'k belongs to the whole submission: leave run blank';
      if (draft.k) return already('k', draft.k.line);
      draft.k = { value, line: row.line };
      return undefined;
    case 'half_life': {
      if (label === '') return 'a half-life needs the run it belongs to';
      const run = draft.runs.get(label);
      if (!run) return `no readings for run "${label}" of student "${studentId}"`;
      if (run.halfLife) return already(`the half-life of run "${label}"`, run.halfLife.line);
      run.halfLife = { value, line: row.line };
      return undefined;
    }
    default:
      return `unknown quantity "${row.cell('quantity')}": use order, k or half_life`;
  }
}

function toSubmission(draft: Draft, decimalComma: boolean): unknown {
  const reported = { ...(draft.order && { order: draft.order.value }), ...(draft.k && { k: draft.k.value }) };
  return {
    studentId: draft.studentId,
    runs: [...draft.runs.values()].map((run) => toRun(run, decimalComma)),
    ...(Object.keys(reported).length > 0 && { reported }),
  };
}

function toRun(run: RunDraft, decimalComma: boolean): unknown {
  const text = (column: RunColumn) => run.values.get(column)?.text;
  const c0 = text('initial_concentration');
  return {
    label: run.label,
    timeUnit: text('time_unit'),
    readings: run.readings,
    ...(c0 !== undefined && { initialConcentration: { value: numberOrText(c0, decimalComma), unit: text('initial_concentration_unit') } }),
    ...(run.halfLife && { reported: { halfLife: run.halfLife.value } }),
  };
}
