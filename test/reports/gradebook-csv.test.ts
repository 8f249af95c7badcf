import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import type { CheckResult, Finding } from '../../schemas/result.ts';
import { GRADEBOOK_COLUMNS, gradebookCsv, neutraliseText } from '../../reports/gradebook-csv.ts';

function finding(code: string, severity: Finding['severity'], pointsLost: number): Finding {
  return { id: `${code}@x`, code, stage: 'run', path: 'x', severity, pointsLost, message: 'm' };
}

function result(studentId: string | null, findings: Finding[] = [], score: number | null = 20): CheckResult {
  return { studentId, status: score === null ? 'rejected' : 'checked', score, maxScore: 22, refit: null, findings, engineVersion: 'test' };
}

const rows = (csv: string): string[][] => parse(csv, { bom: true, relax_column_count: false }) as string[][];

describe('gradebookCsv', () => {
  it('one row per student with the counts and the error codes, most costly first', () => {
    const csv = gradebookCsv([
      result('S-001', [
        finding('sig-figs', 'error', 0.5),
        finding('log-base', 'error', 1),
        finding('carried-forward', 'info', 0),
        finding('implausible', 'warning', 0),
        finding('time-unit', 'error', 2),
        finding('log-base', 'error', 1.5),
      ], 17.5),
      result('S-002', [], null),
    ], { assignment: 'Lab 1' });
    expect(rows(csv)).toEqual([
      ['student_id', 'score', 'max_score', 'status', 'causes_costing_points', 'warnings', 'infos', 'main_codes', 'assignment'],
      // Hand-counted: log-base twice is one cause; with time-unit and sig-figs, 3 causes cost points.
      ['S-001', '17.5', '22', 'checked', '3', '1', '1', 'log-base;time-unit;sig-figs', 'Lab 1'],
      ['S-002', '', '22', 'rejected', '0', '0', '0', '', 'Lab 1'],
    ]);
    expect(rows(csv)[0]).toEqual([...GRADEBOOK_COLUMNS]);
  });

  it('names the assignment on every row, quoted and neutralised like any text cell (RFC 4180; formula prefix as above)', () => {
    const csv = gradebookCsv([result('S-001'), result('S-002')], { assignment: '=Rates, "fast"', notSubmitted: [{ studentId: 'S-003', withdrawn: false }] });
    expect(csv.split('\r\n')[1].endsWith(`,"'=Rates, ""fast"""`)).toBe(true);
    expect(rows(csv).slice(1).map((r) => r.at(-1))).toEqual([`'=Rates, "fast"`, `'=Rates, "fast"`, `'=Rates, "fast"`]);
  });

  it('ends every line with CRLF and adds a BOM only when asked', () => {
    const plain = gradebookCsv([result('S-001')], { assignment: 'Lab 1' });
    expect(plain.startsWith('student_id,')).toBe(true);
    expect(plain.endsWith('\r\n')).toBe(true);
    expect(plain.split('\r\n')).toHaveLength(3);
    expect(gradebookCsv([result('S-001')], { assignment: 'Lab 1', bom: true }).startsWith('\uFEFFstudent_id,')).toBe(true);
  });

  it.each([
    ['=HYPERLINK("http://example.invalid","x")', `'=HYPERLINK("http://example.invalid","x")`],
    ['+1', `'+1`],
    ['-2', `'-2`],
    ['@x', `'@x`],
    ['\tA', `'\tA`],
    ['\rA', `'\rA`],
    ['S-001', 'S-001'],
    ["'already", "'already"],
  ])('a hostile id %j is read back as text %j', (id, expected) => {
    const [, row] = rows(gradebookCsv([result(id)], { assignment: 'Lab 1' }));
    expect(row[0]).toBe(expected);
  });

  it('quotes fields with commas, quotes and line breaks (RFC 4180)', () => {
    const csv = gradebookCsv([result('a,b'), result('say "hi"'), result('two\nlines')], { assignment: 'Lab 1' });
    expect(csv).toContain('"a,b",');
    expect(csv).toContain('"say ""hi""",');
    expect(rows(csv).slice(1).map((r) => r[0])).toEqual(['a,b', 'say "hi"', 'two\nlines']);
  });

  it('neutralises a hostile code list as one text cell', () => {
    const [, row] = rows(gradebookCsv([result('S-001', [finding('-cmd|calc', 'error', 2), finding('=1+1', 'error', 1)])], { assignment: 'Lab 1' }));
    expect(row[7]).toBe(`'-cmd|calc;=1+1`);
  });

  it('leaves number cells as numbers: a negative score is not prefixed', () => {
    const [, row] = rows(gradebookCsv([result('S-001', [], -2)], { assignment: 'Lab 1' }));
    expect(row[1]).toBe('-2');
    expect(neutraliseText('-2')).toBe(`'-2`);
  });
});

describe('gradebookCsv, books a TA can trust', () => {
  it('names and counts only the errors that cost points (an error forgiven to 0 is neither counted nor named)', () => {
    const [, row] = rows(gradebookCsv([result('S-001', [finding('sign-flipped', 'error', 0), finding('time-unit', 'error', 2)], 20)], { assignment: 'Lab 1' }));
    expect(row.slice(4, 8)).toEqual(['1', '0', '0', 'time-unit']);
  });

  it('shows a withdrawn student who submitted as withdrawn, keeping the score of their work', () => {
    const csv = gradebookCsv([result('S-001', [], 20), result('S-002', [], 18), result('S-003', [], null)], { assignment: 'Lab 1', withdrawn: new Set(['S-002', 'S-003']), notSubmitted: [{ studentId: 'S-004', withdrawn: true }] });
    expect(rows(csv).slice(1).map((r) => r.slice(0, 4))).toEqual([
      ['S-001', '20', '22', 'checked'],
      ['S-002', '18', '22', 'withdrawn'],
      ['S-003', '', '22', 'withdrawn'],
      ['S-004', '', '', 'withdrawn'],
    ]);
  });

  it('marks a held late submission `held`, its score kept; withdrawn wins over held', () => {
    const csv = gradebookCsv([result('S-001', [], 20), result('S-002', [], 18), result('S-003', [], 16)], { assignment: 'Lab 1', held: new Set(['S-002', 'S-003']), withdrawn: new Set(['S-003']) });
    expect(rows(csv).slice(1).map((r) => r.slice(0, 4))).toEqual([
      ['S-001', '20', '22', 'checked'],
      ['S-002', '18', '22', 'held'],
      ['S-003', '16', '22', 'withdrawn'],
    ]);
  });
});
