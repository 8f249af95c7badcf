import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { kindFor } from '../../kinds/registry.ts';
import { perUnitLine, readingsLine, reportedLines, wordList } from '../../server/checks/form-lines.ts';
import { Submission as CatalysisSubmission } from '../../kinds/first-order-catalysis/schemas.ts';
import { Submission as TemperatureSubmission } from '../../kinds/temperature-dependence/schemas.ts';
import { Submission as OrderSubmission } from '../../kinds/reaction-order/schemas.ts';
import { kind as decayRuns } from '../support/decay-runs/index.ts';
import { RUN_A, RUN_B, decaySubmission } from '../support/decay-runs/data.ts';

// Every expected line below is hand-written from the submission it is given (hand-worked).
const example = (path: string) => JSON.parse(readFileSync(new URL(`../../docs/examples/${path}`, import.meta.url), 'utf8')) as unknown[];
const summaryOf = (kind: string, submission: unknown) => kindFor(kind)!.formSummary(submission);

describe('the words of a form check', () => {
  it('lists, counts and numbers units from 1', () => {
    expect([wordList([]), wordList(['a']), wordList(['a', 'b']), wordList(['a', 'b', 'c'])]).toEqual(['', 'a', 'a and b', 'a, b and c']);
    expect(readingsLine([16, 16, 16, 16])).toBe('4 runs read, 16 readings each');
    expect(readingsLine([16, 15, 16])).toBe('3 runs read: 16, 15 and 16 readings');
    expect(readingsLine([7])).toBe('1 run read, 7 readings');
    expect(perUnitLine('k', [true, true, false, true])).toBe('k missing for run 3');
    expect(perUnitLine('k', [false, true, false])).toBe('k missing for runs 1 and 3');
    expect(perUnitLine('k', [false, false])).toBe('k not reported for any run');
    expect(perUnitLine('the standard error of k', [true, null, true])).toBe('the standard error of k reported for runs 1 and 3');
    expect(reportedLines([{ name: 'k_N', value: { uncertainty: 1 } }, { name: 'k_A', value: {} }])).toEqual(['k_N and k_A reported', 'not reported: the standard error of k_A']);
    expect(reportedLines([{ name: 'E_a', value: undefined }, { name: 'A', value: undefined, optional: true }])).toEqual(['not reported: E_a']);
  });
});

describe('each kind’s form check says what was read, never a grade', () => {
  it('first-order-catalysis: the example submission, then one with a run short, a k and an error left out', () => {
    const [full] = example('submissions.json').map((s) => CatalysisSubmission.parse(s));
    expect(summaryOf('first-order-catalysis', full)).toEqual([
      '4 runs read, 16 readings each',
      'end value x_inf given for every run',
      'ln F column reported for every run',
      'k reported for every run',
      'the standard error of k reported for every run',
      'k_N and k_A reported with standard errors',
    ]);
    const gappy = structuredClone(full);
    gappy.runs[1].readings.pop();
    gappy.runs[1].reported!.lnF!.pop();
    delete gappy.runs[2].reported!.k;
    delete gappy.runs[3].reported!.lnF;
    delete gappy.reported!.kA!.uncertainty;
    expect(summaryOf('first-order-catalysis', CatalysisSubmission.parse(gappy))).toEqual([
      '4 runs read: 16, 15, 16 and 16 readings',
      'end value x_inf given for every run',
      'ln F column missing for run 4',
      'k missing for run 3',
      'the standard error of k reported for runs 1, 2 and 4',
      'k_N and k_A reported',
      'not reported: the standard error of k_A',
    ]);
  });

  it('temperature-dependence: six measured k without errors and E_a alone; then a run of readings among them', () => {
    const [measured] = example('temperature-dependence/submissions.json').map((s) => TemperatureSubmission.parse(s));
    expect(summaryOf('temperature-dependence', measured)).toEqual([
      '6 temperatures read, each with a measured k',
      'k reported for every temperature',
      'the standard error of k not given for any temperature',
      'E_a reported with its standard error',
      'not reported: A, ΔH‡ and ΔS‡',
    ]);
    const mixed = structuredClone(measured);
    mixed.points[2] = { label: mixed.points[2].label, temperature: mixed.points[2].temperature, run: { timeUnit: 'min', readings: RUN_A.readings, infinity: RUN_A.infinity } };
    expect(summaryOf('temperature-dependence', TemperatureSubmission.parse(mixed))).toEqual([
      '6 temperatures read: 5 measured k and 1 run of readings',
      '1 run read, 7 readings',
      'k missing for temperature 3',
      'the standard error of k not given for any temperature',
      'E_a reported with its standard error',
      'not reported: A, ΔH‡ and ΔS‡',
    ]);
  });

  it('reaction-order: two runs, one with [A]_0 and a half-life, and the order and k with its error', () => {
    const submission = OrderSubmission.parse({
      studentId: 'R-01',
      runs: [
        { label: 'A', timeUnit: 'min', readings: [[0, 0.812], [5, 0.655], [10, 0.529]], initialConcentration: { value: 2e-5, unit: 'M' }, reported: { halfLife: { value: '16.1', unit: 'min' } } },
        { label: 'B', timeUnit: 'min', readings: [[0, 0.401], [5, 0.362], [10, 0.326], [15, 0.294]] },
      ],
      reported: { order: 1, k: { value: '0.0430', uncertainty: '0.0012', unit: 'min^-1' } },
    });
    expect(summaryOf('reaction-order', submission)).toEqual(['2 runs read: 3 and 4 readings', '[A]_0 missing for run 2', 'half-life missing for run 2', 'order 1 reported', 'k reported with its standard error']);
  });

  it('decay-runs (the test kind): runs A (7 readings) and B (4), each with its k', () => {
    expect(RUN_A.readings.length + RUN_B.readings.length).toBe(11);
    expect(decayRuns.checker.formSummary(decaySubmission('S-001', 0.12, 0.25))).toEqual(['2 runs read: 7 and 4 readings', 'k reported for every run']);
  });

  it('never words a grade or a finding', () => {
    const [full] = example('submissions.json');
    const words = summaryOf('first-order-catalysis', CatalysisSubmission.parse(full)).join(' ');
    expect(words).not.toMatch(/point|score|correct|wrong|error:|finding/i);
  });
});
