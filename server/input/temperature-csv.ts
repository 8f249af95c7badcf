import type { CsvRowError, CsvSubmissions } from './csv-layout.ts';
import { numberOrText, numberText, readTable } from './csv-table.ts';

/**
 * The CSV layout of `temperature-dependence` submissions: a points file, one row per temperature
 * (`student_id, label, temperature, temperature_unit, k, k_unit`, optionally `k_uncertainty`), and
 * optionally a reported-values file (`student_id, quantity, value, unit`, optionally `uncertainty`;
 * quantity one of Ea, A, dH, dS). Values are passed on as written for the schema to validate.
 */
const POINT_COLUMNS = ['student_id', 'label', 'temperature', 'temperature_unit', 'k', 'k_unit'];
const REPORTED_COLUMNS = ['student_id', 'quantity', 'value', 'unit'];
const QUANTITIES = ['Ea', 'A', 'dH', 'dS'];

interface Draft {
  studentId: string;
  points: unknown[];
  reported: Record<string, { value: string; uncertainty?: string; unit: string }>;
}

export function parseTemperatureCsv(pointsText: string, reportedText?: string): CsvSubmissions {
  const drafts = new Map<string, Draft>();
  const draftOf = (studentId: string) => drafts.get(studentId) ?? drafts.set(studentId, { studentId, points: [], reported: {} }).get(studentId)!;
  const points = readTable(pointsText, POINT_COLUMNS);
  const rowErrors: CsvRowError[] = points.errors.map((e) => ({ file: 'points', ...e }));
  for (const row of points.rows) {
    const uncertainty = row.cell('k_uncertainty');
    draftOf(row.cell('student_id')).points.push({
      label: row.cell('label'),
      temperature: { value: numberOrText(row.cell('temperature'), points.decimalComma), unit: row.cell('temperature_unit') },
      k: { value: numberText(row.cell('k'), points.decimalComma), ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, points.decimalComma) }), unit: row.cell('k_unit') },
    });
  }
  if (reportedText !== undefined) {
    const reported = readTable(reportedText, REPORTED_COLUMNS);
    rowErrors.push(...reported.errors.map((e) => ({ file: 'reported', ...e })));
    for (const row of reported.rows) {
      const quantity = row.cell('quantity');
      const studentId = row.cell('student_id');
      if (!QUANTITIES.includes(quantity)) {
        rowErrors.push({ file: 'reported', row: row.line, message: `quantity "${quantity}" is not one of ${QUANTITIES.join(', ')}` });
        continue;
      }
      if (!drafts.has(studentId)) {
        rowErrors.push({ file: 'reported', row: row.line, message: `student "${studentId}" has no points in the points file` });
        continue;
      }
      const draft = draftOf(studentId);
      if (draft.reported[quantity]) {
        rowErrors.push({ file: 'reported', row: row.line, message: `${quantity} of student "${studentId}" is given twice` });
        continue;
      }
      const uncertainty = row.cell('uncertainty');
      draft.reported[quantity] = { value: numberText(row.cell('value'), reported.decimalComma), ...(uncertainty !== '' && { uncertainty: numberText(uncertainty, reported.decimalComma) }), unit: row.cell('unit') };
    }
  }
  const submissions = [...drafts.values()].map(({ studentId, points: p, reported: r }) => ({ studentId, points: p, ...(Object.keys(r).length > 0 && { reported: r }) }));
  return { submissions, rowErrors };
}
