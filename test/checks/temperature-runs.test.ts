import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { syntheticReadings } from '../../server/demo/synthetic-run.ts';

/**
 * Points given as first-order runs (invented readings at four temperatures, E_a = 70 kJ/mol): each run
 * is refitted, its reported k graded, and what follows from the student's own k is carried forward.
 */
const R = 8.314462618;
const celsius = [20, 30, 40, 50];
const kPerMinute = celsius.map((c) => 60 * 3e9 * Math.exp(-70000 / (R * (c + 273.15))));
const times = Array.from({ length: 16 }, (_, t) => t * 2);
const runs = kPerMinute.map((k, i) => ({
  timeUnit: 'min',
  readings: syntheticReadings({ k, x0: 20, xInf: 5, times, noise: 0.002, resolution: 0.001, random: seededRandom(40 + i) }).map((x, j): [number, number] => [times[j], Number(x.toFixed(3))]),
  infinity: 5,
}));
const assignment = parseAssignment({ kind: 'temperature-dependence', rubric: { EaUncertainty: 0, A: 0, dH: 0, dS: 0 } });

/** Our k of each run, from a first check with no reported values, per minute. */
const ourK = ((checkSubmission(assignment, { studentId: 'T-00', points: runs.map((run, i) => ({ label: `${celsius[i]} °C`, temperature: { value: celsius[i], unit: 'degC' }, run })) }).refit as { points: Array<{ kPerSecond: number }> }).points).map((p) => p.kPerSecond * 60);

/** E_a in kJ/mol from k per minute at these temperatures, by least squares here apart from the engine. */
function activationEnergy(ks: number[]): number {
  const x = celsius.map((c) => 1 / (c + 273.15));
  const y = ks.map(Math.log);
  const mx = x.reduce((a, b) => a + b, 0) / x.length;
  const my = y.reduce((a, b) => a + b, 0) / y.length;
  const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
  return (-slope * R) / 1000;
}

function submit(ks: number[]) {
  return checkSubmission(assignment, {
    studentId: 'T-01',
    points: runs.map((run, i) => ({ label: `${celsius[i]} °C`, temperature: { value: celsius[i], unit: 'degC' }, run: { ...run, reported: { k: { value: ks[i].toPrecision(4), unit: 'min^-1' } } } })),
    reported: { Ea: { value: activationEnergy(ks).toPrecision(4), unit: 'kJ mol^-1' } },
  });
}

describe('temperature dependence: points given as runs', () => {
  it('refits each run near the k it was made with, and finds nothing wrong in clean work (4 runs x 1 point + E_a 2 points)', () => {
    ourK.forEach((k, i) => expect(Math.abs(k / kPerMinute[i] - 1)).toBeLessThan(0.01));
    const result = submit(ourK);
    expect(result.findings).toEqual([]);
    expect(result.maxScore).toBe(6);
  });

  it("names a run's k reported per second as per minute, and carries E_a forward from the student's own k", () => {
    const ks = ourK.map((k, i) => (i === 2 ? k / 60 : k));
    const result = submit(ks);
    expect(result.findings.map((f) => [f.code, f.path, f.pointsLost])).toEqual([
      ['time-unit', 'points[2].run.reported.k', 1],
      ['carried-forward', 'reported.Ea', 0],
    ]);
    expect(result.score).toBe(5);
  });

  it('names a missing k, and refuses a point with both k and a run', () => {
    const result = checkSubmission(assignment, { studentId: 'T-02', points: runs.map((run, i) => ({ label: `${celsius[i]} °C`, temperature: { value: celsius[i], unit: 'degC' }, run })), reported: { Ea: { value: activationEnergy(ourK).toPrecision(4), unit: 'kJ/mol' } } });
    expect(result.findings.map((f) => `${f.code}@${f.path}`)).toEqual(['missing-value@points[0].run.reported.k', 'missing-value@points[1].run.reported.k', 'missing-value@points[2].run.reported.k', 'missing-value@points[3].run.reported.k']);
    const both = checkSubmission(assignment, { studentId: 'T-03', points: [{ label: 'a', temperature: { value: 20, unit: 'degC' }, run: runs[0], k: { value: 0.1, unit: 'min^-1' } }, ...runs.slice(1).map((run, i) => ({ label: `${i}`, temperature: { value: celsius[i + 1], unit: 'degC' }, run }))] });
    expect(both.rejected).toEqual([{ path: 'points[0].k', message: 'either k (a measured rate constant) or run (readings to refit), not both or neither' }]);
  });
});
