import { describe, expect, it } from 'vitest';
import type { FindingCode } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { cleanCase } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';

// Slips of method change k together with its standard error: with k right, none of them can be
// the cause of a wrong standard error.
const CHANGE_K: FindingCode[] = ['wrong-infinity', 'swapped-axes', 'half-life-for-rate', 'log-base', 'time-unit', 'sign-flipped'];

// Invented run: x(t) = 6.35 + 15.0 e^(-0.08 t) to 0.001 deg, with a little scatter added so the fits
// have standard errors; x_inf recorded as 6.35.
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { lnF: 0 } });
const times = Array.from({ length: 16 }, (_, t) => t);
const scatter = [0, 3, -2, 4, -5, 1, 2, -3, 5, -1, -4, 2, 3, -2, 0, 1].map((d) => d / 1000);
const readings = times.map((t, i): [number, number] => [t, Number((6.35 + 15 * Math.exp(-0.08 * t) + scatter[i]).toFixed(3))]);

/** k and its standard error as a student computes them: least squares through the origin of ln F. */
function fitWith(infinity: number): { k: number; se: number } {
  const x0 = readings[0][1];
  const lnF = readings.map(([, x]) => Math.log((x - infinity) / (x0 - infinity)));
  const stt = times.reduce((s, t) => s + t * t, 0);
  const slope = times.reduce((s, t, i) => s + t * lnF[i], 0) / stt;
  const sse = times.reduce((s, t, i) => s + (lnF[i] - slope * t) ** 2, 0);
  return { k: -slope, se: Math.sqrt(sse / (times.length - 1) / stt) };
}

const submit = (k: number, se: number) =>
  checkSubmission(assignment, {
    studentId: 'C-01',
    runs: [{ label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings, infinity: 6.35, reported: { k: { value: Number(k.toPrecision(5)), uncertainty: Number(se.toPrecision(2)), unit: 'min^-1' } } }],
  });

describe('a cause for a wrong standard error when k is right', () => {
  it('is not the slip of x_inf whose standard error it happens to equal: k rules that slip out', () => {
    const right = fitWith(6.35);
    const slipped = fitWith(6.53);
    expect(Math.abs(slipped.se / right.se - 1)).toBeGreaterThan(0.25);
    const finding = submit(right.k, slipped.se).findings.find((f) => f.path === 'runs[0].reported.k.uncertainty');
    expect(finding).toMatchObject({ code: 'unexplained', severity: 'error' });
    // The same SE beside the k that x_inf gives is that slip, carried with its k.
    const withItsK = submit(slipped.k, slipped.se).findings;
    expect(withItsK.find((f) => f.path === 'runs[0].reported.k')).toMatchObject({ code: 'wrong-infinity' });
    expect(withItsK.find((f) => f.path === 'runs[0].reported.k.uncertainty')).toBeUndefined();
  });

  it('is named for random wrong values no more often than their chance of landing near a candidate', () => {
    // Generated clean work (invented data, see the generator), one run's SE replaced by a random value
    // 1/20 to 20 times it (log-uniform), outside the band that counts as right.
    const random = seededRandom(11);
    const named: string[] = [];
    let cases = 0;
    for (let seed = 0; seed < 300; seed++) {
      const { settings, submission } = cleanCase(seed);
      const k = submission.runs[0].reported?.k;
      if (!k?.uncertainty) continue;
      let factor = 1;
      while (Math.abs(Math.log(factor)) < Math.log(1.4)) factor = 20 ** (2 * random() - 1);
      k.uncertainty = Number((Number(k.uncertainty) * factor).toPrecision(2));
      const result = checkSubmission(parseAssignment(settings), submission);
      expect(result.findings.find((f) => f.path === 'runs[0].reported.k' && f.severity === 'error')).toBeUndefined();
      const finding = result.findings.find((f) => f.path === 'runs[0].reported.k.uncertainty')!;
      expect(finding.severity).toBe('error');
      expect(CHANGE_K).not.toContain(finding.code);
      if (finding.code !== 'unexplained') named.push(finding.code);
      cases++;
    }
    // Four candidates stay (x10, x0.1, the points' SD, the 95 % half-width), each matched within
    // 10 %: about 4 x 0.2 / ln(400) = 13 % of log-uniform values land on one by chance.
    console.log(`named ${named.length} of ${cases} random wrong standard errors`);
    expect(cases).toBeGreaterThan(250);
    expect(named.length / cases).toBeLessThan(0.2);
  });
});
