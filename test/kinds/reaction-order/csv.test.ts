import { describe, expect, it } from 'vitest';
import { parseReactionOrderCsv } from '../../../kinds/reaction-order/csv.ts';
import { Submission } from '../../../kinds/reaction-order/schemas.ts';

// Hand-written files; the expected objects are what the layout in kinds/reaction-order/csv.ts says
// the rows mean, written out by hand.
const READINGS = [
  'student_id,run,time_unit,t,signal,initial_concentration,initial_concentration_unit',
  'R-01,A,min,0,0.812,2.0e-5,M',
  'R-01,A,min,5,0.655,,',
  'R-01,A,min,10,0.529,,',
  'R-01,B,min,0,0.401,,',
  'R-01,B,min,5,0.362,,',
  'R-01,B,min,10,0.326,,',
  'R-02,A,s,0,0.790,,',
  'R-02,A,s,300,0.640,,',
  'R-02,A,s,600,0.540,,',
].join('\n');

const REPORTED = [
  'student_id,run,quantity,value,unit,uncertainty',
  'R-01,,order,1,,',
  'R-01,,k,0.0430,min^-1,0.0012',
  'R-01,A,half_life,16.1,min,',
  'R-02,,order,2,,',
  'R-02,,k,1.2e3,M^-1 s^-1,',
].join('\n');

describe('reaction-order submissions from CSV', () => {
  it('files readings by student and run, and the order, k and half-lives by their rows', () => {
    const read = parseReactionOrderCsv(READINGS, REPORTED);
    expect(read.rowErrors).toEqual([]);
    expect(read.lines).toEqual([2, 8]);
    expect(read.submissions[0]).toEqual({
      studentId: 'R-01',
      runs: [
        { label: 'A', timeUnit: 'min', readings: [[0, 0.812], [5, 0.655], [10, 0.529]], initialConcentration: { value: 2e-5, unit: 'M' }, reported: { halfLife: { value: '16.1', unit: 'min' } } },
        { label: 'B', timeUnit: 'min', readings: [[0, 0.401], [5, 0.362], [10, 0.326]] },
      ],
      reported: { order: 1, k: { value: '0.0430', uncertainty: '0.0012', unit: 'min^-1' } },
    });
    // The digits as written survive (0.0430 has three significant figures), and the schema takes both.
    for (const s of read.submissions) expect(Submission.safeParse(s).success).toBe(true);
    expect(Submission.parse(read.submissions[1]).reported).toEqual({ order: 2, k: { value: '1.2e3', unit: 'M^-1 s^-1' } });
  });

  it('reads a semicolon file with decimal commas', () => {
    const read = parseReactionOrderCsv('student_id;run;time_unit;t;signal\nR-03;1;min;0;0,500\nR-03;1;min;2,5;0,250\nR-03;1;min;5;0,000', 'student_id;quantity;value;unit\nR-03;order;0;\nR-03;k;0,100;M min^-1');
    expect(read.rowErrors).toEqual([]);
    expect(read.submissions).toEqual([{ studentId: 'R-03', runs: [{ label: '1', timeUnit: 'min', readings: [[0, 0.5], [2.5, 0.25], [5, 0]] }], reported: { order: 0, k: { value: '0.100', unit: 'M min^-1' } } }]);
  });

  it('names the row and the clash where the files disagree with themselves', () => {
    const read = parseReactionOrderCsv(
      'student_id,run,time_unit,t,signal\nR-01,A,min,0,1\nR-01,A,s,60,0.9',
      'student_id,run,quantity,value,unit\nR-01,,order,1,\nR-01,,order,2,\nR-01,,rate,3,\nR-01,C,half_life,3,min\nR-09,,k,1,min^-1\nR-01,,half_life,2,min',
    );
    expect(read.rowErrors).toEqual([
      { file: 'readings', row: 3, message: 'run "A" of student "R-01": time_unit is min on line 2 but s on line 3' },
      { file: 'reported', row: 3, message: 'the order of student "R-01" is already given on line 2' },
      { file: 'reported', row: 4, message: 'unknown quantity "rate": use order, k or half_life' },
      { file: 'reported', row: 5, message: 'no readings for run "C" of student "R-01"' },
      { file: 'reported', row: 6, message: 'no readings for student "R-09"' },
      { file: 'reported', row: 7, message: 'a half-life needs the run it belongs to' },
    ]);
  });

  it('leaves a value that is not a number as written, for the schema to refuse at its path', () => {
    const read = parseReactionOrderCsv('student_id,run,time_unit,t,signal\nR-01,A,min,0,n/a', 'student_id,quantity,value,unit\nR-01,order,first,\nR-01,k,0.1,min^-1');
    const parsed = Submission.safeParse(read.submissions[0]);
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toContain('reported.order');
    expect(paths.some((p) => p.startsWith('runs.0.readings'))).toBe(true);
  });

  it('without a reported file, the submission has no reported values and the schema says so', () => {
    const read = parseReactionOrderCsv('student_id,run,time_unit,t,signal\nR-01,A,min,0,1\nR-01,A,min,1,0.5\nR-01,A,min,2,0.25');
    const parsed = Submission.safeParse(read.submissions[0]);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((i) => i.path.join('.'))).toEqual(['reported']);
  });
});
