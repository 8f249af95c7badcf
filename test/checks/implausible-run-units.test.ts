import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * Invented, noise-free runs as in run-not-fitted.test.ts: x(t) = 5 + 15 e^(-k t), k_obs = 0.01 + 0.1 c
 * min^-1, readings every minute for 10 minutes. The assignment's reference bands (k_N 0.008-0.012
 * min^-1, k_A 0.09-0.11 M^-1 min^-1) put k_obs at 0.2 M between 0.008 + 0.09 x 0.2 = 0.026 and
 * 0.012 + 0.11 x 0.2 = 0.034 min^-1 (worked by hand). A k more than 30 times outside that which
 * lands inside with times 60 times longer or shorter is named (common practice, no source).
 */
const curve = (k: number, times: number[]) => times.map((t): [number, number] => [t, 5 + 15 * Math.exp(-k * t)]);
const minutes = Array.from({ length: 11 }, (_, t) => t);
const run = (label: string, c: number, timeUnit: string, readings: Array<[number, number]>, k: { value: number; unit: string }, temperatureC?: number) => ({
  label,
  catalyst: { value: c, unit: 'M' },
  timeUnit,
  readings,
  infinity: 5,
  ...(temperatureC === undefined ? {} : { temperatureC }),
  reported: { k: { value: Number(k.value.toPrecision(3)), unit: k.unit } },
});
const kAt = (c: number) => 0.01 + 0.1 * c;
const runs = [0.1, 0.2, 0.3].map((c, i) => run(`R${i + 1}`, c, 'min', curve(kAt(c), minutes), { value: kAt(c), unit: 'min^-1' }));
const reference = { kN: { min: 0.008, max: 0.012, unit: 'min^-1' }, kA: { min: 0.09, max: 0.11, unit: 'M^-1 min^-1' } };
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', reference });
const reported = { kN: { value: 0.01, unit: 'min^-1' }, kA: { value: 0.1, unit: 'M^-1 min^-1' } };
const named = (submissionRuns: unknown[], code: string) =>
  checkSubmission(assignment, { studentId: 'U-01', runs: submissionRuns, reported }).findings.filter((f) => f.code === code);

describe('times that cannot fit their unit', () => {
  it('minutes declared as seconds: k = 0.03 s^-1 = 1.8 min^-1, over 30 x 0.034; read per minute, 0.03 lies in 0.026-0.034', () => {
    const seconds = run('R2', 0.2, 's', curve(kAt(0.2), minutes), { value: kAt(0.2), unit: 's^-1' });
    const found = named([runs[0], seconds, runs[2]], 'time-unit-implausible');
    expect(found).toEqual([expect.objectContaining({ path: 'runs[1].timeUnit', severity: 'warning', pointsLost: 0 })]);
    expect(found[0].message).toContain('the times were probably in min');
  });

  it('seconds declared as minutes: k = 0.03/60 = 5e-4 min^-1, under 0.026/30; read per second, in the band', () => {
    const seconds = minutes.map((t) => 60 * t);
    const asMinutes = run('R2', 0.2, 'min', curve(kAt(0.2) / 60, seconds), { value: kAt(0.2) / 60, unit: 'min^-1' });
    const found = named([runs[0], asMinutes, runs[2]], 'time-unit-implausible');
    expect(found.map((f) => f.path)).toEqual(['runs[1].timeUnit']);
    expect(found[0].message).toContain('the times were probably in s');
  });

  it('the run is checked in the unit meant: its k per minute, right for minutes, costs nothing (as a TA reads it)', () => {
    const labelledSeconds = run('R2', 0.2, 's', curve(kAt(0.2), minutes), { value: kAt(0.2), unit: 'min^-1' });
    const result = checkSubmission(assignment, { studentId: 'U-04', runs: [runs[0], labelledSeconds, runs[2]], reported });
    const plain = checkSubmission(assignment, { studentId: 'U-04', runs, reported });
    // The fixture reports no SEs or ln F: those cost the same in both; nothing more is charged.
    const charged = (r: typeof plain) => r.findings.filter((f) => f.pointsLost > 0).map((f) => `${f.code} ${f.path}`);
    expect(charged(result)).toEqual(charged(plain));
    expect(result.score).toBe(plain.score);
    expect(result.findings.find((f) => f.code === 'time-unit-implausible')?.message).toContain('checked as if its times were in min');
  });

  it('runs in their declared unit, and any run without reference bands, draw nothing', () => {
    expect(named(runs, 'time-unit-implausible')).toEqual([]);
    const seconds = run('R2', 0.2, 's', curve(kAt(0.2), minutes), { value: kAt(0.2), unit: 's^-1' });
    const withoutBands = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin' });
    const result = checkSubmission(withoutBands, { studentId: 'U-02', runs: [runs[0], seconds, runs[2]], reported });
    expect(result.findings.filter((f) => f.code === 'time-unit-implausible')).toEqual([]);
  });
});

describe("a run's recorded temperature that cannot be what was typed (250-400 K, common practice, no source)", () => {
  it('298.15 written as degrees Celsius: probably kelvin; 25 degC draws nothing; nothing else changes', () => {
    const hot = { ...runs[0], temperatureC: 298.15 };
    const fine = { ...runs[1], temperatureC: 25 };
    const result = checkSubmission(assignment, { studentId: 'U-03', runs: [hot, fine, runs[2]], reported });
    const found = result.findings.filter((f) => f.code === 'temperature-implausible');
    expect(found).toEqual([expect.objectContaining({ path: 'runs[0].temperatureC', severity: 'warning', pointsLost: 0 })]);
    expect(found[0].message).toContain('probably 298.15 K was meant (25 °C)');
    const plain = checkSubmission(assignment, { studentId: 'U-03', runs, reported });
    expect(result.score).toBe(plain.score);
  });
});
