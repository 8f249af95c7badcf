import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkedDisplay } from '../../reports/display/submission-display.ts';
import { firstOrderCatalysisReport } from '../../kinds/first-order-catalysis/report/report.ts';
import { formatEstimate, formatReported } from '../../reports/format.ts';
import { temperatureDependenceReport } from '../../kinds/temperature-dependence/report/report.ts';
import type { KindReport } from '../../reports/kind-report.ts';
import { SubmissionDisplay } from '../../schemas/display.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { stagesOf } from '../../kinds/registry.ts';

/**
 * The workspace's student page as the server sends it (the display payload), against values written
 * out by hand: hand-made submissions whose readings follow F = exp(−k t) exactly, checked by the real
 * checker, and the formatting of a reported value as one would write it.
 */
function display(settings: unknown, submission: unknown, report: KindReport) {
  const assignment = parseAssignment(settings);
  const parsed = assignment.kind.submissionSchema.parse(submission);
  const kindSettings = assignment.settings as { kind: string };
  const input = { header: { course: 'C', section: 'S', assignment: 'A', studentId: 'H-01', version: 1, gradedAt: '2025-03-04T14:30:00Z' }, settings: kindSettings, submission: parsed, result: checkSubmission(assignment, submission) };
  // What the route answers must pass the route's response schema.
  return SubmissionDisplay.parse(checkedDisplay(input, { describe: (path) => report.describePath(path, parsed), stages: stagesOf(kindSettings.kind), kindDisplay: report.display }));
}

describe('numbers as written by hand', () => {
  it('writes our value ± SE with the SE to 2 figures and the value to the same place (hand-computed)', () => {
    // SE 2.598e-8 is 0.026 × 10⁻⁶ to 2 figures; the value 8.857e-6 to the same place is 8.857 × 10⁻⁶.
    expect(formatEstimate(8.857e-6, 2.598e-8)).toBe('(8.857 ± 0.026) × 10⁻⁶');
    // SE 2.598 is 2.6; −141.03 to the tenths is −141.0, with the minus sign.
    expect(formatEstimate(-141.03, 2.598)).toBe('−141.0 ± 2.6');
    expect(formatEstimate(0.00053142, 1.9e-7)).toBe('(5.3142 ± 0.0019) × 10⁻⁴');
    // An SE of 2600 to 2 figures is at the hundreds: the value is rounded there too.
    expect(formatEstimate(12345.6, 2600)).toBe('12300 ± 2600');
  });

  it('keeps the student’s digits, in × 10ⁿ notation', () => {
    expect(formatReported('8.857e-6')).toBe('8.857 × 10⁻⁶');
    expect(formatReported('0.000530')).toBe('0.000530');
  });
});

describe('the first kind’s display', () => {
  // Readings at t = 30, 90, …, 330 s, F = exp(−k t) with t from the first reading, x_∞ = 0.
  const times = [0, 60, 120, 180, 240, 300];
  const run = (label: string, c: number, kPerSecond: number, reported: unknown) => ({ label, catalyst: { value: c, unit: 'M' }, timeUnit: 's', readings: times.map((t) => [t + 30, Math.exp(-kPerSecond * t)]), infinity: 0, reported: { k: reported } });
  const submission = {
    studentId: 'H-01',
    runs: [
      // k = 1/120 s⁻¹ = 0.5 min⁻¹, reported as 0.5 per second: the factor-of-60 slip.
      run('0.10 M', 0.1, 1 / 120, { value: '0.5', unit: 's^-1' }),
      run('0.20 M', 0.2, 1 / 60, { value: '8.857e-6', uncertainty: '2.598e-8', unit: 's^-1' }),
      run('0.30 M', 0.3, 1 / 40, { value: '1.5', uncertainty: '0.01', unit: 'min^-1' }),
    ],
  };
  const d = display({ kind: 'first-order-catalysis', fitModel: 'origin' }, submission, firstOrderCatalysisReport);

  it('shows the student’s value exactly as written, with its unit, beside the refit', () => {
    const rows = d.comparison!.rows;
    expect(d.comparison!.columns.map((c) => c.header)).toEqual(['Quantity', 'Run', 'Reported', 'Refit', 'Unit', 'Difference', 'Tolerance']);
    expect(rows[1].slice(0, 3)).toEqual(['k_{obs}', '“0.20 M”', '8.857 × 10⁻⁶ ± 2.598 × 10⁻⁸']);
    expect(rows[1][4]).toBe('s⁻¹');
    // (0.5 − 1/120) / (1/120) = 59 = +5900 % (hand-computed).
    expect(rows[0][5]).toBe('+5900 %');
    expect(rows[2].slice(2, 6)).toEqual(['1.5 ± 0.01', '1.500 ± 0', 'min⁻¹', '0.00 %']);
  });

  it('draws a run timed in seconds with the line through its points, and the student’s line beside it (hand-computed)', () => {
    const plot = d.plots.find((p) => p.title === 'ln F against t, runs timed in s')!;
    expect(plot.x.label).toBe('t / s');
    const points = plot.series.find((s) => s.group === 0 && s.points)!.points!;
    // ln F = −t / 120 at t = 0, 60, …, 300 s.
    const hand = [[0, 0], [60, -0.5], [120, -1], [180, -1.5], [240, -2], [300, -2.5]];
    points.forEach(([t, y], i) => {
      expect(t).toBe(hand[i][0]);
      expect(y).toBeCloseTo(hand[i][1], 9);
    });
    const ours = plot.series.find((s) => s.group === 0 && s.owner === 'refit' && s.line)!.line!;
    for (const [t, y] of hand) expect(ours.intercept + ours.slope * t).toBeCloseTo(y, 9);
    // The student's 0.5 s⁻¹: a line 60 times as steep, dashed, with a note of both values.
    const theirs = plot.series.find((s) => s.group === 0 && s.owner === 'student' && s.line)!.line!;
    expect(theirs.slope).toBeCloseTo(-0.5, 12);
    expect(plot.notes[0]).toBe('Run “0.10 M”: refit k_{obs} = 0.008333 s⁻¹; the student’s 0.5000 s⁻¹ (dashed)');
    // Ticks every 100 s over 0 to 300 s, as the sheet rounds an axis out.
    expect(plot.x.ticks.map((t) => t.label)).toEqual(['0', '100', '200', '300']);
  });

  it('groups the findings one card per cause, places in words, no path outside the detail', () => {
    const cards = d.stages.flatMap((s) => s.cards);
    const text = JSON.stringify(d.stages.map((s) => [s.title, s.cards.map((c) => [c.where, c.message, c.places.map((p) => [p.place, p.values])])]));
    expect(text).not.toMatch(/runs\[|reported\./);
    const slip = cards.find((c) => c.codes === 'time-unit')!;
    expect(slip.where).toBe('Run “0.10 M”, k_{obs}');
    expect(slip.places.map((p) => p.path)).toEqual(['runs[0].reported.k']);
    // The missing values (ln F columns, the SE of run 0.10 M, k_N, k_A) are one cause: one card.
    expect(cards.filter((c) => c.codes === 'missing-value')).toHaveLength(1);
    expect(d.counts).toMatch(/^\d+ findings cost points/);
  });
});

describe('the second kind’s display', () => {
  const example = (name: string) => JSON.parse(readFileSync(new URL(`../../docs/examples/temperature-dependence/${name}`, import.meta.url), 'utf8'));
  const submission = example('submissions.json')[0] as { points: Array<{ temperature: { value: number }; k: { value: string } }>; reported: Record<string, unknown> };
  // E_a reported as 80 kJ/mol, written in J/mol: compared in the refit's unit.
  const d = display(example('assignment.json'), { ...submission, reported: { Ea: { value: '80000', unit: 'J mol^-1' } } }, temperatureDependenceReport);

  it('gives the relative difference, the reported value in the refit’s unit (hand-computed least squares)', () => {
    // ln k against 1/T by ordinary least squares, E_a = −slope · R (R = 8.314462618 J mol⁻¹ K⁻¹, CODATA).
    const xs = submission.points.map((p) => 1 / p.temperature.value);
    const ys = submission.points.map((p) => Math.log(Number(p.k.value)));
    const mx = xs.reduce((a, b) => a + b) / xs.length;
    const my = ys.reduce((a, b) => a + b) / ys.length;
    const slope = xs.reduce((s, x, i) => s + (x - mx) * (ys[i] - my), 0) / xs.reduce((s, x) => s + (x - mx) ** 2, 0);
    const ea = -slope * 8.314462618;
    const percent = ((80000 - ea) / ea) * 100;
    expect(d.comparison!.columns.map((c) => c.header)).toEqual(['Quantity', 'Reported', 'Refit', 'Difference', 'Tolerance']);
    expect(d.comparison!.rows[0][0]).toBe('E_{a}');
    expect(d.comparison!.rows[0][1]).toBe('80000 J mol⁻¹');
    expect(d.comparison!.rows[0][3]).toBe(`+${percent.toFixed(2)} %`);
  });

  it('sends the Arrhenius and Eyring plots, with the student’s line where they reported E_a and A', () => {
    expect(d.plots.map((p) => p.title)).toEqual(['Arrhenius: ln k against 1/T', 'Eyring: ln(k/T) against 1/T']);
    const arrhenius = d.plots[0];
    // x = 1000 K / T and y = ln k of the first point, by hand.
    const [x, y] = arrhenius.series[0].points![0];
    expect(x).toBeCloseTo(1000 / submission.points[0].temperature.value, 12);
    expect(y).toBeCloseTo(Math.log(Number(submission.points[0].k.value)), 2);
    // Without A the student's line cannot be drawn, and the note says why.
    expect(arrhenius.series.some((s) => s.owner === 'student')).toBe(false);
    expect(arrhenius.notes[1]).toBe('The student’s line is not drawn: E_{a} or A not reported.');
  });
});
