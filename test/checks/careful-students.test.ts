import { describe, expect, it } from 'vitest';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import type { Submission as TemperatureSubmission } from '../../kinds/temperature-dependence/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { gaussian as normal, seededRandom as seeded } from '../../server/demo/seeded-random.ts';

// Careful students, made here independently of the demo generator and of the engine (only the seeded
// random numbers are shared): invented runs, each analysed as a careful student does (ln F, least
// squares in closed form written below), each value rounded as common practice has it (no source):
// the standard error to 1 or 2 significant figures, the value to the same decimal place. Such work
// is right, and must draw no charged finding.

/** Least squares of y on x in closed form: through the origin (n - 1 degrees of freedom) or with an intercept (n - 2). */
function leastSquares(x: number[], y: number[], origin: boolean): { slope: number; seSlope: number; intercept: number; seIntercept: number } {
  const n = x.length;
  if (origin) {
    const sxx = x.reduce((s, xi) => s + xi * xi, 0);
    const slope = x.reduce((s, xi, i) => s + xi * y[i], 0) / sxx;
    const sse = x.reduce((s, xi, i) => s + (y[i] - slope * xi) ** 2, 0);
    return { slope, seSlope: Math.sqrt(sse / (n - 1) / sxx), intercept: 0, seIntercept: 0 };
  }
  const mx = x.reduce((s, v) => s + v, 0) / n;
  const my = y.reduce((s, v) => s + v, 0) / n;
  const sxx = x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
  const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / sxx;
  const intercept = my - slope * mx;
  const s2 = x.reduce((s, xi, i) => s + (y[i] - intercept - slope * xi) ** 2, 0) / (n - 2);
  return { slope, seSlope: Math.sqrt(s2 / sxx), intercept, seIntercept: Math.sqrt(s2 * (1 / n + (mx * mx) / sxx)) };
}

/**
 * Weighted least squares (weights 1/sigma^2) in closed form, the standard errors in either convention
 * in use: sigma taken as absolute, or scaled by the reduced chi-square sum(w r^2)/(n - 2).
 */
function weightedLeastSquares(x: number[], y: number[], sigma: number[], scaled: boolean): { slope: number; seSlope: number; intercept: number; seIntercept: number } {
  const w = sigma.map((s) => 1 / (s * s));
  const sum = (f: (i: number) => number) => w.reduce((acc, wi, i) => acc + wi * f(i), 0);
  const [s0, sx, sy, sxx, sxy] = [sum(() => 1), sum((i) => x[i]), sum((i) => y[i]), sum((i) => x[i] * x[i]), sum((i) => x[i] * y[i])];
  const d = s0 * sxx - sx * sx;
  const slope = (s0 * sxy - sx * sy) / d;
  const intercept = (sxx * sy - sx * sxy) / d;
  const scale = scaled ? sum((i) => (y[i] - intercept - slope * x[i]) ** 2) / (x.length - 2) : 1;
  return { slope, seSlope: Math.sqrt((scale * s0) / d), intercept, seIntercept: Math.sqrt((scale * sxx) / d) };
}

/** A value and its SE as a careful student writes them: the SE to `figures` significant figures, the value to its place; as text (trailing zeros kept) or as a JSON number. */
function written(value: number, se: number, figures: number, asText: boolean, unit: string) {
  const places = figures - 1 - Math.floor(Math.log10(se));
  // To the tens or hundreds (an SE of 880 J/mol), the places left of the point are filled with zeros.
  const round = (x: number) => (places >= 0 ? x.toFixed(places) : (Math.round(x * 10 ** places) / 10 ** places).toFixed(0));
  const v = round(value);
  const u = round(se);
  return asText ? { value: v, uncertainty: u, unit } : { value: Number(v), uncertainty: Number(u), unit };
}

const charged = (findings: Array<{ pointsLost: number; code: string; path: string; message: string }>) => findings.filter((f) => f.pointsLost > 0);

describe('200 careful students of the first kind', () => {
  it('lose no point: every value rounded correctly is right, near zero too', () => {
    const random = seeded(20261205);
    const acid = [0.05, 0.1, 0.2, 0.4];
    const times = Array.from({ length: 16 }, (_, t) => t);
    const losses: string[] = [];
    for (let student = 0; student < 200; student++) {
      const origin = student % 2 === 0;
      const figures = 1 + (student % 3 === 0 ? 0 : 1);
      const asText = student % 4 < 2;
      // k_N from -0.002 to 0.012 min^-1 (near zero, where no relative tolerance holds), k_A 0.1 to 0.3 M^-1 min^-1.
      const kN = -0.002 + 0.014 * random();
      const kA = 0.1 + 0.2 * random();
      const runs = acid.map((c, r) => {
        const k = kN + kA * c;
        const end = 2 + 5 * random();
        const span = 10 + 5 * random();
        const readings = times.map((t): [number, number] => [t, Number((end + span * Math.exp(-k * t) + 0.003 * normal(random)).toFixed(3))]);
        const infinity = Number((end + 0.002 * normal(random)).toFixed(3));
        const lnF = readings.map(([, x]) => Math.log((x - infinity) / (readings[0][1] - infinity)));
        const fit = leastSquares(times, lnF, origin);
        return {
          label: `run ${r + 1}`,
          catalyst: { value: c, unit: 'M' },
          timeUnit: 'min',
          readings,
          infinity,
          reported: { lnF: lnF.map((v) => Number(v.toFixed(4))), k: written(-fit.slope, fit.seSlope, figures, asText, 'min^-1') },
        };
      });
      // The rate law from the student's own k as written, or from the unrounded ones: both careful.
      const ks = runs.map((run) => Number(run.reported.k.value));
      const law = leastSquares(acid, ks, false);
      const submission: Submission = {
        studentId: `C-${student}`,
        runs,
        reported: { kN: written(law.intercept, law.seIntercept, figures, asText, 'min^-1'), kA: written(law.slope, law.seSlope, figures, asText, 'M^-1 min^-1') },
      };
      const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: origin ? 'origin' : 'intercept', rubric: { sigFigs: 1 } });
      const result = checkSubmission(assignment, submission);
      expect(result.status).toBe('checked');
      for (const f of charged(result.findings)) losses.push(`student ${student}: ${f.code} at ${f.path}: ${f.message}`);
    }
    console.log(`careful students of the first kind: ${losses.length} charged findings in 200 submissions`);
    expect(losses).toEqual([]);
  });
});

describe('200 careful students of the second kind', () => {
  // R = 8.314462618 J K^-1 mol^-1, k_B = 1.380649e-23 J K^-1 and h = 6.62607015e-34 J s: exact SI values.
  const R = 8.314462618;
  const lnKbOverH = Math.log(1.380649e-23 / 6.62607015e-34);

  it('lose no point: E_a, A, dH, dS and the SE of E_a, rounded correctly, are right', () => {
    const random = seeded(20261206);
    const temperatures = [288.15, 298.15, 308.15, 318.15, 328.15, 338.15];
    const losses: string[] = [];
    for (let student = 0; student < 200; student++) {
      const figures = 1 + (student % 3 === 0 ? 0 : 1);
      const asText = student % 4 < 2;
      // E_a 40 to 100 kJ/mol; A set so that k at 298 K is 1e-4 to 1e-2 s^-1; 3 % scatter in k.
      const Ea = 40000 + 60000 * random();
      const k298 = 10 ** (-4 + 2 * random());
      const lnA = Math.log(k298) + Ea / (R * 298.15);
      // Every other pair of students fits with weights, each k given with its SE (3 %, to 2 figures).
      const weighted = (student >> 1) % 2 === 1;
      const points = temperatures.map((T, i) => {
        const k = Math.exp(lnA - Ea / (R * T)) * (1 + 0.03 * normal(random));
        const measured: { value: number; uncertainty?: number; unit: string } = weighted ? written(k, 0.03 * k, 2, false, 's^-1') as { value: number; uncertainty: number; unit: string } : { value: Number(k.toPrecision(4)), unit: 's^-1' };
        return { label: `T${i + 1}`, temperature: { value: T, unit: 'K' as const }, k: measured };
      });
      const x = temperatures.map((T) => 1 / T);
      const ks = points.map((p) => p.k.value);
      const sigmas = points.map((p, i) => Number(p.k.uncertainty) / ks[i]);
      // Of those, every other pair scales the standard errors by the scatter about the line.
      const scaled = (student >> 2) % 2 === 1;
      const fit = (y: number[]) => (weighted ? weightedLeastSquares(x, y, sigmas, scaled) : leastSquares(x, y, false));
      const arrhenius = fit(ks.map(Math.log));
      const eyring = fit(ks.map((k, i) => Math.log(k / temperatures[i])));
      // Every other student gives E_a in J/mol, where its SE has trailing zeros (880) that are not significant.
      const perJoule = student % 2 === 1;
      const EaFit = (-arrhenius.slope * R) / (perJoule ? 1 : 1000);
      const EaSE = (arrhenius.seSlope * R) / (perJoule ? 1 : 1000);
      // A, dH, dS with the SEs that follow from those of the fits, to fix the place each is written to.
      const A = Math.exp(arrhenius.intercept);
      const dH = (-eyring.slope * R) / 1000;
      const dS = R * (eyring.intercept - lnKbOverH);
      const one = (value: number, se: number, unit: string) => {
        const w = written(value, se, figures, asText, unit);
        return { value: w.value, unit };
      };
      const submission: TemperatureSubmission = {
        studentId: `T-${student}`,
        points,
        reported: {
          Ea: written(EaFit, EaSE, figures, asText, perJoule ? 'J mol^-1' : 'kJ mol^-1'),
          A: one(A, A * arrhenius.seIntercept, 's^-1'),
          dH: one(dH, (eyring.seSlope * R) / 1000, 'kJ mol^-1'),
          dS: one(dS, R * eyring.seIntercept, 'J K^-1 mol^-1'),
        },
      };
      const result = checkSubmission(parseAssignment({ kind: 'temperature-dependence', fit: weighted ? 'weighted' : 'ordinary', rubric: { sigFigs: 1 } }), submission);
      expect(result.status).toBe('checked');
      for (const f of charged(result.findings)) losses.push(`student ${student}: ${f.code} at ${f.path}: ${f.message}`);
    }
    console.log(`careful students of the second kind: ${losses.length} charged findings in 200 submissions`);
    expect(losses).toEqual([]);
  });
});
