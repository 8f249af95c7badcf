import { describe, expect, it } from 'vitest';
import { withStudentColumn } from '../../server/input/own-student-column.ts';

// Every expected text below is written by hand from the file given (hand-worked).
describe("a student's own CSV without student_id", () => {
  it('gains the column at the end of the header and of every row, each line keeping its number', () => {
    expect(withStudentColumn('run,t,x\n1,0,5.2\r\n1,1,4.9\n', 'S-7')).toBe('run,t,x,student_id\n1,0,5.2,S-7\r\n1,1,4.9,S-7\n');
  });

  it('writes it with the file\'s own delimiter, after blank lines above the header, leaving bare-delimiter rows for the reader to skip', () => {
    expect(withStudentColumn('\nrun;t;x\n1;0;5,2\n;;\n', 'S-7')).toBe('\nrun;t;x;student_id\n1;0;5,2;S-7\n;;\n');
  });

  it('leaves a file that has the column (in any case, quoted or not) as it is, and an empty one too', () => {
    expect(withStudentColumn('"Student_ID",run\nS-7,1\n', 'S-7')).toBe('"Student_ID",run\nS-7,1\n');
    expect(withStudentColumn('\n\n', 'S-7')).toBe('\n\n');
  });
});
