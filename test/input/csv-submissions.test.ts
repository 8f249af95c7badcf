import { describe, expect, it } from 'vitest';
import { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { parseSubmissionsCsv } from '../../kinds/first-order-catalysis/csv.ts';

// Invented pseudonymous ids and round numbers: these tests are of the layout, not of kinetics.
const comma = [
  'student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity',
  's-01,A,0.05,M,min,0,10.5,1.2',
  's-01,A,0.05,M,min,1,9.5,1.2',
  's-01,A,0.05,M,min,2,8.6,1.2',
  's-02,A,0.10,M,min,0,10.4,1.1',
  's-01,B,0.10,M,min,0,10.2,1.0',
  's-02,A,0.10,M,min,1,8.9,1.1',
  's-02,A,0.10,M,min,2,7.7,1.1',
  's-01,B,0.10,M,min,1,8.8,1.0',
  's-01,B,0.10,M,min,2,7.6,1.0',
].join('\n');

describe('readings file', () => {
  it('groups rows by student and run in order of first appearance, readings in file order', () => {
    const { submissions, rowErrors } = parseSubmissionsCsv(comma);
    expect(rowErrors).toEqual([]);
    expect(submissions).toEqual([
      {
        studentId: 's-01',
        runs: [
          { label: 'A', catalyst: { value: 0.05, unit: 'M' }, timeUnit: 'min', readings: [[0, 10.5], [1, 9.5], [2, 8.6]], infinity: 1.2 },
          { label: 'B', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: [[0, 10.2], [1, 8.8], [2, 7.6]], infinity: 1.0 },
        ],
      },
      {
        studentId: 's-02',
        runs: [{ label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: [[0, 10.4], [1, 8.9], [2, 7.7]], infinity: 1.1 }],
      },
    ]);
    expect(Submission.safeParse(submissions[0]).success).toBe(true);
  });

  it('says on which line each submission starts: its first row, counting the header as line 1', () => {
    // s-01 first appears on line 2, s-02 on line 5 (counted by hand in the text above).
    expect(parseSubmissionsCsv(comma).lines).toEqual([2, 5]);
  });

  it('reads semicolons with decimal commas, a BOM, CRLF, free column order and any header case', () => {
    const text = '\uFEFFX;T;Time_Unit;Catalyst_Unit;Catalyst;Run;Student_ID;Temperature_C\r\n10,5;0;min;M;0,05;A;s-01;25,0\r\n9,5;1;min;M;0,05;A;s-01;25\r\n8,6;2;min;M;0,05;A;s-01;\r\n';
    const { submissions, rowErrors } = parseSubmissionsCsv(text);
    expect(rowErrors).toEqual([]);
    expect(submissions).toEqual([
      {
        studentId: 's-01',
        runs: [{ label: 'A', catalyst: { value: 0.05, unit: 'M' }, timeUnit: 'min', readings: [[0, 10.5], [1, 9.5], [2, 8.6]], temperatureC: 25 }],
      },
    ]);
  });

  it('does not take a comma for a decimal point in a comma-separated file', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x\ns-01,A,0.05,M,min,0,"10,5"\n';
    const [submission] = parseSubmissionsCsv(text).submissions as Array<{ runs: Array<{ readings: unknown[] }> }>;
    expect(submission.runs[0].readings).toEqual([[0, '10,5']]);
  });

  it('keeps a non-numeric reading as written, so the schema rejects it at its path', () => {
    const text = comma.replace('s-01,A,0.05,M,min,1,9.5,1.2', 's-01,A,0.05,M,min,1,9.5o,1.2');
    const { submissions, rowErrors } = parseSubmissionsCsv(text);
    expect(rowErrors).toEqual([]);
    const parsed = Submission.safeParse(submissions[0]);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues[0].path).toEqual(['runs', 0, 'readings', 1, 1]);
  });

  it('takes infinity from the one row of the run that gives it', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity\ns-01,A,0.05,M,min,0,10.5,\ns-01,A,,,,1,9.5,\ns-01,A,,,,2,8.6,1.20\n';
    const { submissions, rowErrors } = parseSubmissionsCsv(text);
    expect(rowErrors).toEqual([]);
    expect(submissions).toMatchObject([{ runs: [{ catalyst: { value: 0.05, unit: 'M' }, timeUnit: 'min', infinity: 1.2 }] }]);
  });

  it('leaves infinity out of a run that never gives it', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity\ns-01,A,0.05,M,min,0,10.5,\ns-01,A,0.05,M,min,1,9.5,\n';
    const [submission] = parseSubmissionsCsv(text).submissions as Array<{ runs: object[] }>;
    expect(submission.runs[0]).not.toHaveProperty('infinity');
  });

  it('names both lines when a run gives two different infinities', () => {
    const text = comma.replace('s-01,A,0.05,M,min,2,8.6,1.2', 's-01,A,0.05,M,min,2,8.6,1.3');
    expect(parseSubmissionsCsv(text).rowErrors).toEqual([
      { file: 'readings', row: 4, message: 'run "A" of student "s-01": infinity is 1.2 on line 2 but 1.3 on line 4' },
    ]);
  });

  it('reads the ln F column with blanks as null, keeping the digits as written', () => {
    const text = 'student_id;run;catalyst;catalyst_unit;time_unit;t;x;lnF\ns-01;A;0,05;M;min;0;10,5;0\ns-01;A;0,05;M;min;1;9,5;\ns-01;A;0,05;M;min;2;8,6;-0,250\n';
    expect(parseSubmissionsCsv(text).submissions).toMatchObject([{ runs: [{ reported: { lnF: ['0', null, '-0.250'] } }] }]);
  });

  it('gives no ln F for a run whose ln F cells are all blank', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x,lnf\ns-01,A,0.05,M,min,0,10.5,\ns-01,A,0.05,M,min,1,9.5,\n';
    const [submission] = parseSubmissionsCsv(text).submissions as Array<{ runs: object[] }>;
    expect(submission.runs[0]).not.toHaveProperty('reported');
  });

  it('skips blank lines and rows of bare delimiters, counting them in line numbers', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x\n\n,,,,,,\ns-01,A,0.05,M,min,0\n';
    expect(parseSubmissionsCsv(text).rowErrors).toEqual([{ file: 'readings', row: 4, message: '6 fields where the header has 7' }]);
  });
});

describe('structural problems', () => {
  it('reports an empty file', () => {
    expect(parseSubmissionsCsv('\uFEFF\n  \n')).toEqual({ submissions: [], lines: [], rowErrors: [{ file: 'readings', row: 1, message: 'the file is empty' }] });
  });

  it('reports a header with no rows below it', () => {
    expect(parseSubmissionsCsv('student_id,run,catalyst,catalyst_unit,time_unit,t,x\n').rowErrors).toEqual([
      { file: 'readings', row: 2, message: 'no rows below the header' },
    ]);
  });

  it('names each missing column once, on the header line', () => {
    const text = 'student_id,run,catalyst,time_unit,t\ns-01,A,0.05,min,0\ns-01,A,0.05,min,1\n';
    expect(parseSubmissionsCsv(text)).toEqual({
      submissions: [],
      lines: [],
      rowErrors: [
        { file: 'readings', row: 1, message: 'missing column "catalyst_unit"' },
        { file: 'readings', row: 1, message: 'missing column "x"' },
      ],
    });
  });

  it('reports a quote that is never closed', () => {
    const [error] = parseSubmissionsCsv('student_id,run,catalyst,catalyst_unit,time_unit,t,x\ns-01,"A,0.05,M,min,0,1\n').rowErrors;
    expect(error.file).toBe('readings');
    expect(error.message).toMatch(/quote/i);
  });
});

describe('reported-values file', () => {
  const readings = 'student_id;run;catalyst;catalyst_unit;time_unit;t;x\ns-01;A;0,05;M;min;0;10,5\ns-01;B;0,10;M;min;0;10,2\n';

  it('joins k to its run and kN, kA to the submission, keeping the text as written', () => {
    const reported = 'Student_ID;Run;Quantity;Value;Uncertainty;Unit\ns-01;B;k;0,0810;0,0021;min^-1\ns-01;A;k;0,0520;;min^-1\ns-01;;kN;0,0221;0,0010;min^-1\ns-01;;KA;0,594;0,012;M^-1 min^-1\n';
    const { submissions, rowErrors } = parseSubmissionsCsv(readings, reported);
    expect(rowErrors).toEqual([]);
    expect(submissions).toMatchObject([
      {
        runs: [{ label: 'A', reported: { k: { value: '0.0520', unit: 'min^-1' } } }, { label: 'B', reported: { k: { value: '0.0810', uncertainty: '0.0021', unit: 'min^-1' } } }],
        reported: { kN: { value: '0.0221', uncertainty: '0.0010', unit: 'min^-1' }, kA: { value: '0.594', uncertainty: '0.012', unit: 'M^-1 min^-1' } },
      },
    ]);
    const [submission] = submissions as Array<{ runs: Array<{ reported: { k: object } }> }>;
    expect(submission.runs[0].reported.k).not.toHaveProperty('uncertainty');
  });

  it('keeps "0.0520" as written in a comma-separated file', () => {
    const text = 'student_id,run,catalyst,catalyst_unit,time_unit,t,x\ns-01,A,0.05,M,min,0,10.5\n';
    const reported = 'student_id,run,quantity,value,uncertainty,unit\ns-01,A,k,0.0520,0.0020,min^-1\n';
    expect(parseSubmissionsCsv(text, reported).submissions).toMatchObject([{ runs: [{ reported: { k: { value: '0.0520', uncertainty: '0.0020' } } }] }]);
  });

  it('reports rows it cannot place, each on its own line of the reported file', () => {
    const reported = [
      'student_id;run;quantity;value;uncertainty;unit',
      's-01;;k;0,05;;min^-1',
      's-01;C;k;0,05;;min^-1',
      's-09;A;k;0,05;;min^-1',
      's-01;A;kN;0,02;;min^-1',
      's-01;;t½;12;;min',
      's-01;A;k;0,0520;;min^-1',
      's-01;A;k;0,0521;;min^-1',
    ].join('\n');
    expect(parseSubmissionsCsv(readings, reported).rowErrors).toEqual([
      { file: 'reported', row: 2, message: 'k needs the run it belongs to' },
      { file: 'reported', row: 3, message: 'no readings for run "C" of student "s-01"' },
      { file: 'reported', row: 4, message: 'no readings for student "s-09"' },
      { file: 'reported', row: 5, message: 'kN belongs to the whole submission: leave run blank' },
      { file: 'reported', row: 6, message: 'unknown quantity "t½": use k, kN or kA (with the equilibrium block also alpha_eq, x_B, k_eq, kf, kr per run, and k_eq, kNf, kNr, kAf, kAr with run blank)' },
      { file: 'reported', row: 8, message: 'k of run "A" of student "s-01" is already given on line 7' },
    ]);
  });

  it('names a missing column of the reported file', () => {
    expect(parseSubmissionsCsv(readings, 'student_id;run;value;unit\ns-01;A;0,05;min^-1\n').rowErrors).toEqual([
      { file: 'reported', row: 1, message: 'missing column "quantity"' },
    ]);
  });
});
