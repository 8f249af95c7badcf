import type { CsvSubmissions } from '../../server/input/csv-layout.ts';
import { fileRows } from '../../server/input/csv-rows.ts';
import { numberOrText, numberText, type Row } from '../../server/input/csv-table.ts';

/**
 * The CSV layout of `temperature-dependence` submissions: a points file and optionally a reported-values
 * file. Values are passed on as written for the schema to validate.
 * - Points: `student_id, label, temperature, temperature_unit`, and for a measured rate constant one
 *   row with `k, k_unit` (optionally `k_uncertainty`); for a run, one row per reading with `t, x` and
 *   `time_unit` (optionally `infinity`), its temperature repeated or given once.
 * - Reported: `student_id, quantity, value, unit` (optionally `uncertainty`), quantity one of Ea, A,
 *   dH, dS, or `k` with the run's `label` for the k a student found from that run.
 */
export const POINT_COLUMNS = ['student_id', 'label', 'temperature', 'temperature_unit'];
export const REPORTED_COLUMNS = ['student_id', 'quantity', 'value', 'unit'];
const QUANTITIES = ['Ea', 'A', 'dH', 'dS'];

interface ReportedText {
  value: string;
  uncertainty?: string;
  unit: string;
}

interface PointDraft {
  label: string;
  first: Row;
  run?: { timeUnit: string; infinity?: number | string; readings: Array<[number | string, number | string]>; reported?: { k: ReportedText } };
  k?: ReportedText;
}

interface Draft {
  studentId: string;
  points: Map<string, PointDraft>;
  reported: Record<string, ReportedText>;
}

export function parseTemperatureCsv(pointsText: string, reportedText?: string): CsvSubmissions {
  const drafts = new Map<string, Draft>();
  const { firstLine, rowErrors, decimalComma } = fileRows(
    { file: 'points', text: pointsText, columns: POINT_COLUMNS, add: (row, comma) => addPointRow(drafts, row, comma) },
    reportedText === undefined ? undefined : { file: 'reported', text: reportedText, columns: REPORTED_COLUMNS, add: (row, comma) => addReported(drafts, row, comma) },
  );
  const submissions = [...drafts.values()].map(({ studentId, points: p, reported: r }) => ({
    studentId,
    points: [...p.values()].map((point) => toPoint(point, decimalComma)),
    ...(Object.keys(r).length > 0 && { reported: r }),
  }));
  return { submissions, lines: [...drafts.keys()].map((id) => firstLine.get(id)!), rowErrors };
}

/** Files a row under its student and point; returns a message when the point's rows disagree. */
function addPointRow(drafts: Map<string, Draft>, row: Row, decimalComma: boolean): string | undefined {
  const studentId = row.cell('student_id');
  const label = row.cell('label');
  const draft = drafts.get(studentId) ?? drafts.set(studentId, { studentId, points: new Map(), reported: {} }).get(studentId)!;
  const point = draft.points.get(label) ?? draft.points.set(label, { label, first: row }).get(label)!;
  const where = `point "${label}" of student "${studentId}"`;
  for (const column of ['temperature', 'temperature_unit']) {
    const text = row.cell(column);
    if (text !== '' && text !== point.first.cell(column)) return `${where}: ${column} is ${point.first.cell(column)} on line ${point.first.line} but ${text} on line ${row.line}`;
  }
  const isReading = row.cell('t') !== '' || row.cell('x') !== '';
  if (isReading) {
    if (point.k) return `${where} has a measured k and readings: give one or the other`;
    point.run ??= { timeUnit: row.cell('time_unit'), readings: [] };
    if (row.cell('infinity') !== '') point.run.infinity = numberOrText(row.cell('infinity'), decimalComma);
    point.run.readings.push([numberOrText(row.cell('t'), decimalComma), numberOrText(row.cell('x'), decimalComma)]);
    return undefined;
  }
  if (point.run || point.k) return `${where} is given twice`;
  const uncertainty = row.cell('k_uncertainty');
  point.k = { value: numberText(row.cell('k'), decimalComma), ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, decimalComma) }), unit: row.cell('k_unit') };
  return undefined;
}

function addReported(drafts: Map<string, Draft>, row: Row, decimalComma: boolean): string | undefined {
  const quantity = row.cell('quantity');
  const studentId = row.cell('student_id');
  const draft = drafts.get(studentId);
  if (!draft) return `student "${studentId}" has no points in the points file`;
  const uncertainty = row.cell('uncertainty');
  const value: ReportedText = { value: numberText(row.cell('value'), decimalComma), ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, decimalComma) }), unit: row.cell('unit') };
  if (quantity === 'k') {
    const run = draft.points.get(row.cell('label'))?.run;
    if (!run) return `k of student "${studentId}" names no run: the label "${row.cell('label')}" is not a point given as readings`;
    if (run.reported) return `k of run "${row.cell('label')}" of student "${studentId}" is given twice`;
    run.reported = { k: value };
    return undefined;
  }
  if (!QUANTITIES.includes(quantity)) return `quantity "${quantity}" is not one of ${[...QUANTITIES, 'k'].join(', ')}`;
  if (draft.reported[quantity]) return `${quantity} of student "${studentId}" is given twice`;
  draft.reported[quantity] = value;
  return undefined;
}

function toPoint(point: PointDraft, decimalComma: boolean): unknown {
  const temperature = { value: numberOrText(point.first.cell('temperature'), decimalComma), unit: point.first.cell('temperature_unit') };
  if (point.run) {
    const { timeUnit, infinity, readings, reported } = point.run;
    return { label: point.label, temperature, run: { timeUnit, readings, ...(infinity !== undefined && { infinity }), ...(reported && { reported }) } };
  }
  return { label: point.label, temperature, ...(point.k && { k: point.k }) };
}
