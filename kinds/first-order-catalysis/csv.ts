import { fileRows } from '../../server/input/csv-rows.ts';
import { keepRunValues, type RunValues } from '../../server/input/run-values.ts';
import { numberOrText, numberText, type Row } from '../../server/input/csv-table.ts';

/**
 * The CSV layout of `first-order-catalysis` submissions: a readings file, one row per reading, and
 * optionally a reported-values file. Text in, Submission-shaped plain objects out, no file I/O.
 * Values are not validated here: the schema does that in checkSubmission and names each field's
 * path, so a value that is not a number is passed on as written instead of being dropped.
 * Only the layout itself (columns, field counts, agreement of a run's values) is checked here.
 */

import type { CsvSubmissions } from '../../server/input/csv-layout.ts';


// Required columns, lower case. Optional ones: infinity, lnf and temperature_c in the readings file,
// uncertainty in the reported file. Any other column is ignored, so a spreadsheet may keep notes.
export const READINGS_COLUMNS = ['student_id', 'run', 'catalyst', 'catalyst_unit', 'time_unit', 't', 'x'];
export const REPORTED_COLUMNS = ['student_id', 'run', 'quantity', 'value', 'unit'];

/** Values that belong to a run rather than to a reading; they may repeat on each row or appear once. */
const RUN_COLUMNS = ['catalyst', 'catalyst_unit', 'time_unit', 'infinity', 'temperature_c'] as const;
type RunColumn = (typeof RUN_COLUMNS)[number];


/** A reported value as ReportedValue wants it: the digits as written, so significant figures survive. */
interface ReportedText {
  value: string;
  uncertainty?: string;
  unit: string;
}

interface ReportedDraft {
  reported: ReportedText;
  line: number;
}

/**
 * The reported file's quantities besides k, kN and kA (compared in lower case), with the field each
 * fills: per run where `run` is given, for the whole submission where it is blank. `k_eq` is K (the
 * mean K with `run` blank): lower case cannot tell K from k.
 */
const RUN_QUANTITIES = { alpha_eq: 'specificRotation', x_b: 'xB', k_eq: 'K', kf: 'kf', kr: 'kr' } as const;
const WHOLE_QUANTITIES = { k_eq: 'K', knf: 'kNf', knr: 'kNr', kaf: 'kAf', kar: 'kAr' } as const;
type RunField = 'k' | (typeof RUN_QUANTITIES)[keyof typeof RUN_QUANTITIES];
type WholeField = 'kN' | 'kA' | (typeof WHOLE_QUANTITIES)[keyof typeof WHOLE_QUANTITIES];

interface RunDraft {
  label: string;
  values: RunValues<RunColumn>;
  readings: Array<[number | string, number | string]>;
  lnF: Array<string | null>;
  reported: Map<RunField, ReportedDraft>;
}

interface SubmissionDraft {
  studentId: string;
  runs: Map<string, RunDraft>;
  reported: Map<WholeField, ReportedDraft>;
}

/** Parses a readings file and, when given, a reported-values file into Submission-shaped objects. */
export function parseSubmissionsCsv(readingsText: string, reportedText?: string): CsvSubmissions {
  const drafts = new Map<string, SubmissionDraft>();
  const { firstLine, rowErrors, decimalComma } = fileRows(
    { file: 'readings', text: readingsText, columns: READINGS_COLUMNS, add: (row, comma) => addReading(drafts, row, comma) },
    reportedText === undefined ? undefined : { file: 'reported', text: reportedText, columns: REPORTED_COLUMNS, add: (row, comma) => addReported(drafts, row, comma) },
  );
  return { submissions: [...drafts.values()].map((draft) => toSubmission(draft, decimalComma)), lines: [...drafts.keys()].map((id) => firstLine.get(id)!), rowErrors };
}

/** Files the row under its student and run; returns a message when the run's values disagree. */
function addReading(drafts: Map<string, SubmissionDraft>, row: Row, decimalComma: boolean): string | undefined {
  const studentId = row.cell('student_id');
  const label = row.cell('run');
  const draft = drafts.get(studentId) ?? { studentId, runs: new Map(), reported: new Map() };
  drafts.set(studentId, draft);
  const run = draft.runs.get(label) ?? { label, values: new Map(), readings: [], lnF: [], reported: new Map() };
  draft.runs.set(label, run);

  run.readings.push([numberOrText(row.cell('t'), decimalComma), numberOrText(row.cell('x'), decimalComma)]);
  const lnF = row.cell('lnf');
  run.lnF.push(lnF === '' ? null : numberText(lnF, decimalComma));

  return keepRunValues(run.values, RUN_COLUMNS, row, decimalComma, `run "${label}" of student "${studentId}"`);
}

function addReported(drafts: Map<string, SubmissionDraft>, row: Row, decimalComma: boolean): string | undefined {
  const studentId = row.cell('student_id');
  const label = row.cell('run');
  const quantity = row.cell('quantity');
  const draft = drafts.get(studentId);
  if (!draft) return `no readings for student "${studentId}"`;
  const uncertainty = row.cell('uncertainty');
  const value: ReportedDraft = {
    reported: {
      value: numberText(row.cell('value'), decimalComma),
      ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, decimalComma) }),
      unit: row.cell('unit'),
    },
    line: row.line,
  };

  const name = quantity.toLowerCase();
  const runField: RunField | undefined = name === 'k' ? 'k' : label !== '' ? RUN_QUANTITIES[name as keyof typeof RUN_QUANTITIES] : undefined;
  const wholeField: WholeField | undefined = name === 'kn' ? 'kN' : name === 'ka' ? 'kA' : label === '' ? WHOLE_QUANTITIES[name as keyof typeof WHOLE_QUANTITIES] : undefined;
  if (runField) {
    if (label === '') return `${quantity} needs the run it belongs to`;
    const run = draft.runs.get(label);
    if (!run) return `no readings for run "${label}" of student "${studentId}"`;
    const earlier = run.reported.get(runField);
    if (earlier) return `${quantity} of run "${label}" of student "${studentId}" is already given on line ${earlier.line}`;
    run.reported.set(runField, value);
    return undefined;
  }
  if (wholeField) {
    if (label !== '') return `${wholeField} belongs to the whole submission: leave run blank`;
    const earlier = draft.reported.get(wholeField);
    if (earlier) return `${wholeField} of student "${studentId}" is already given on line ${earlier.line}`;
    draft.reported.set(wholeField, value);
    return undefined;
  }
  return `unknown quantity "${quantity}": use k, kN or kA (with the equilibrium block also alpha_eq, x_B, k_eq, kf, kr per run, and k_eq, kNf, kNr, kAf, kAr with run blank)`;
}

function toSubmission(draft: SubmissionDraft, decimalComma: boolean): unknown {
  const reported = Object.fromEntries([...draft.reported].map(([field, d]) => [field, d.reported]));
  return {
    studentId: draft.studentId,
    runs: [...draft.runs.values()].map((run) => toRun(run, decimalComma)),
    ...(Object.keys(reported).length > 0 && { reported }),
  };
}

function toRun(run: RunDraft, decimalComma: boolean): unknown {
  const text = (column: RunColumn) => run.values.get(column)?.text;
  const number = (column: RunColumn) => {
    const value = text(column);
    return value === undefined ? undefined : numberOrText(value, decimalComma);
  };
  // A run whose ln F cells are all blank gave no ln F column, as if the key were left out.
  const lnF = run.lnF.some((v) => v !== null) ? run.lnF : undefined;
  const reported = { ...(lnF && { lnF }), ...Object.fromEntries([...run.reported].map(([field, d]) => [field, d.reported])) };
  return {
    label: run.label,
    catalyst: { value: number('catalyst'), unit: text('catalyst_unit') },
    timeUnit: text('time_unit'),
    readings: run.readings,
    ...(text('infinity') !== undefined && { infinity: number('infinity') }),
    ...(text('temperature_c') !== undefined && { temperatureC: number('temperature_c') }),
    ...(Object.keys(reported).length > 0 && { reported }),
  };
}
