import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { parseTemperatureCsv } from '../../kinds/temperature-dependence/csv.ts';

/** The CSV layout of the temperature-dependence kind, on invented rows. */
const POINTS = [
  'student_id;label;temperature;temperature_unit;k;k_uncertainty;k_unit',
  'T-01;15 °C;15;degC;0,000412;;s^-1',
  'T-01;25 °C;298,15;K;0,00118;0,00002;s^-1',
  'T-01;35 °C;35;degC;0,00311;;s^-1',
  'T-02;15 °C;15;degC;0,000401;;s^-1',
  'T-02;25 °C;25;degC;0,00121;;s^-1',
  'T-02;35 °C;35;degC;0,00305;;s^-1',
].join('\n');
const REPORTED = ['student_id,quantity,value,uncertainty,unit', 'T-01,Ea,75.02,2.1,kJ mol^-1', 'T-01,dS,-48.5,,J K^-1 mol^-1'].join('\n');

describe('temperature-dependence CSV layout', () => {
  it('reads points (decimal commas with ;) and reported values into submissions the kind checks', () => {
    const { submissions, rowErrors } = parseTemperatureCsv(POINTS, REPORTED);
    expect(rowErrors).toEqual([]);
    expect(submissions).toEqual([
      {
        studentId: 'T-01',
        points: [
          { label: '15 °C', temperature: { value: 15, unit: 'degC' }, k: { value: '0.000412', unit: 's^-1' } },
          { label: '25 °C', temperature: { value: 298.15, unit: 'K' }, k: { value: '0.00118', uncertainty: '0.00002', unit: 's^-1' } },
          { label: '35 °C', temperature: { value: 35, unit: 'degC' }, k: { value: '0.00311', unit: 's^-1' } },
        ],
        reported: { Ea: { value: '75.02', uncertainty: '2.1', unit: 'kJ mol^-1' }, dS: { value: '-48.5', unit: 'J K^-1 mol^-1' } },
      },
      expect.objectContaining({ studentId: 'T-02' }),
    ]);
    const assignment = parseAssignment({ kind: 'temperature-dependence' });
    expect(submissions.map((s) => checkSubmission(assignment, s).status)).toEqual(['checked', 'checked']);
  });

  it('names the file and line of a quantity it does not know, a student without points, and a missing column', () => {
    const reported = ['student_id,quantity,value,unit', 'T-01,Eact,75,kJ/mol', 'T-09,Ea,75,kJ/mol'].join('\n');
    expect(parseTemperatureCsv(POINTS, reported).rowErrors).toEqual([
      { file: 'reported', row: 2, message: 'quantity "Eact" is not one of Ea, A, dH, dS, k' },
      { file: 'reported', row: 3, message: 'student "T-09" has no points in the points file' },
    ]);
    expect(parseTemperatureCsv('student_id,label,temperature,k,k_unit\nT-01,a,15,0.1,s^-1').rowErrors).toEqual([{ file: 'points', row: 1, message: 'missing column "temperature_unit"' }]);
  });

  it('reads a point given as a run, one row per reading, with its k in the reported file under its label', () => {
    const rows = ['student_id,label,temperature,temperature_unit,time_unit,t,x,infinity'];
    const ks = [0.05, 0.1, 0.2];
    [20, 30, 40].forEach((c, i) => {
      for (const t of [0, 2, 4, 6, 8]) rows.push(`T-05,${c} °C,${t === 0 ? c : ''},${t === 0 ? 'degC' : ''},min,${t},${(5 + 15 * Math.exp(-ks[i] * t)).toFixed(3)},${t === 0 ? 5 : ''}`);
    });
    const reported = 'student_id,quantity,label,value,unit\nT-05,k,30 °C,0.1000,min^-1\nT-05,k,50 °C,0.3,min^-1';
    const { submissions, rowErrors } = parseTemperatureCsv(rows.join('\n'), reported);
    expect(rowErrors).toEqual([{ file: 'reported', row: 3, message: 'k of student "T-05" names no run: the label "50 °C" is not a point given as readings' }]);
    const [submission] = submissions as Array<{ points: Array<{ label: string; temperature: unknown; run: { timeUnit: string; readings: unknown[]; infinity: number; reported?: unknown } }> }>;
    expect(submission.points.map((p) => [p.label, p.temperature, p.run.timeUnit, p.run.readings.length, p.run.infinity])).toEqual([
      ['20 °C', { value: 20, unit: 'degC' }, 'min', 5, 5],
      ['30 °C', { value: 30, unit: 'degC' }, 'min', 5, 5],
      ['40 °C', { value: 40, unit: 'degC' }, 'min', 5, 5],
    ]);
    expect(submission.points[1].run.reported).toEqual({ k: { value: '0.1000', unit: 'min^-1' } });
    const assignment = parseAssignment({ kind: 'temperature-dependence' });
    expect(checkSubmission(assignment, submission).status).toBe('checked');
  });
});
