import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * Temperatures typed in the wrong unit (invented data). Kinetics in a teaching lab is done between
 * 250 and 400 K (common practice, no source); 0 degC = 273.15 K by the definition of the Celsius
 * scale. The student below measured at 15, 25 and 35 degC and computed E_a and the rest correctly in
 * kelvin, but typed the temperatures as 15, 25, 35 with unit K. A TA grades the work against what was
 * meant, and names the typing once per temperature, for no points.
 */
const R = 8.314462618; // J K^-1 mol^-1, exact in the SI since 2019
const LN_KB_OVER_H = Math.log(1.380649e-23 / 6.62607015e-34);
const celsius = [15, 25, 35];
const kelvin = celsius.map((t) => t + 273.15);
// E_a = 60 kJ/mol and A = 1e8 s^-1 with a little scatter (invented).
const scatter = [1.01, 0.985, 1.008];
const ks = kelvin.map((T, i) => 1e8 * Math.exp(-60000 / (R * T)) * scatter[i]);

/** Least squares of y on x: slope, intercept and the slope's standard error (textbook formulas). */
function line(x: number[], y: number[]) {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  const sxx = x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
  const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / sxx;
  const intercept = my - slope * mx;
  const sse = x.reduce((s, xi, i) => s + (y[i] - intercept - slope * xi) ** 2, 0);
  return { slope, intercept, seSlope: Math.sqrt(sse / (n - 2) / sxx) };
}

/** E_a (with its SE), A, ΔH‡, ΔS‡ as a student computes them with temperatures T in 1/T. */
function byHand(T: number[]) {
  const x = T.map((t) => 1 / t);
  const arr = line(x, ks.map(Math.log));
  const eyr = line(x, ks.map((k, i) => Math.log(k / T[i])));
  return { Ea: -R * arr.slope, EaSE: R * arr.seSlope, A: Math.exp(arr.intercept), dH: -R * eyr.slope, dS: R * (eyr.intercept - LN_KB_OVER_H) };
}

const assignment = parseAssignment({ kind: 'temperature-dependence' });
const reportedFrom = (v: ReturnType<typeof byHand>) => ({
  // Written as a student rounds them: the SE to 2 figures, E_a to the same place.
  Ea: { value: (v.Ea / 1000).toFixed(1), uncertainty: (v.EaSE / 1000).toFixed(1), unit: 'kJ mol^-1' },
  A: { value: v.A.toPrecision(3), unit: 's^-1' },
  dH: { value: (v.dH / 1000).toPrecision(4), unit: 'kJ mol^-1' },
  dS: { value: v.dS.toPrecision(4), unit: 'J K^-1 mol^-1' },
});
const typed = (values: number[], unit: 'K' | 'degC') => values.map((t, i) => ({ label: `P${i + 1}`, temperature: { value: t, unit }, k: { value: ks[i], unit: 's^-1' } }));

describe('temperatures that cannot be what was typed', () => {
  it('15, 25, 35 "K" (degrees Celsius meant): each named with 288.15, 298.15, 308.15 K, and the correct answers keep every point', () => {
    const result = checkSubmission(assignment, { studentId: 'T-CK', points: typed(celsius, 'K'), reported: reportedFrom(byHand(kelvin)) });
    expect(result.status).toBe('checked');
    const named = result.findings.filter((f) => f.code === 'temperature-implausible');
    expect(named.map((f) => f.path)).toEqual(['points[0].temperature.value', 'points[1].temperature.value', 'points[2].temperature.value']);
    expect(named.every((f) => f.severity === 'warning' && f.pointsLost === 0)).toBe(true);
    expect(named[1].message).toContain('probably 25 °C was meant, which is 298.15 K');
    const refit = result.refit as { points: Array<{ temperatureK: number }> };
    expect(refit.points.map((p) => p.temperatureK)).toEqual(kelvin);
    // Hand verdict: E_a 2 + SE 1 + A 1 + ΔH‡ 2 + ΔS‡ 2 = 8 of 8; nothing else found.
    expect(result.findings.filter((f) => f.code !== 'temperature-implausible')).toEqual([]);
    expect(result.score).toBe(8);
    expect(result.maxScore).toBe(8);
  });

  it('the same typing by a student who also put degrees Celsius in 1/T: that slip is named as ever', () => {
    const v = byHand(celsius);
    // E_a is small this way (a few kJ/mol), so it is written to 4 figures.
    const reported = { ...reportedFrom(v), Ea: { value: (v.Ea / 1000).toPrecision(4), unit: 'kJ mol^-1' } };
    const result = checkSubmission(assignment, { studentId: 'T-CK', points: typed(celsius, 'K'), reported });
    expect(result.findings.filter((f) => f.pointsLost > 0).map((f) => `${f.code}@${f.path}`)).toContain('temperature-scale@reported.Ea');
  });

  it('298.15, 308.15 written as degC (kelvin meant) are read as kelvin; -10 "K" as -10 degC = 263.15 K rather than refused', () => {
    const result = checkSubmission(assignment, { studentId: 'T-KC', points: typed([-10, 298.15, 308.15], 'degC'), reported: reportedFrom(byHand(kelvin)) });
    const messages = result.findings.filter((f) => f.code === 'temperature-implausible').map((f) => f.message);
    expect(messages).toHaveLength(2);
    expect(messages[0]).toContain('probably 298.15 K was meant');
    const k = checkSubmission(assignment, { studentId: 'T-NK', points: typed([-10, 25, 35], 'K'), reported: reportedFrom(byHand(kelvin)) });
    expect(k.status).toBe('checked');
    expect((k.refit as { points: Array<{ temperatureK: number }> }).points[0].temperatureK).toBeCloseTo(263.15, 10);
  });

  it('1000 K, which no unit makes plausible, is named and used as written', () => {
    const result = checkSubmission(assignment, { studentId: 'T-HOT', points: typed([288.15, 298.15, 1000], 'K'), reported: reportedFrom(byHand(kelvin)) });
    const named = result.findings.filter((f) => f.code === 'temperature-implausible');
    expect(named.map((f) => f.path)).toEqual(['points[2].temperature.value']);
    expect(named[0].message).toContain('It is used as written');
    expect((result.refit as { points: Array<{ temperatureK: number }> }).points[2].temperatureK).toBe(1000);
  });

  it('temperatures inside 250-400 K draw nothing', () => {
    const result = checkSubmission(assignment, { studentId: 'T-OK', points: typed(kelvin, 'K'), reported: reportedFrom(byHand(kelvin)) });
    expect(result.findings.map((f) => f.message)).toEqual([]);
  });
});

describe('a run whose times cannot fit their unit (second kind)', () => {
  // Invented: E_a = 75 kJ/mol, A = 2e10 s^-1. The bands E_a 74-76 kJ/mol and A 1.5e10-2.5e10 s^-1 allow
  // at 298.15 K k from 1.5e10 e^(-76000/RT) to 2.5e10 e^(-74000/RT), about 7.3e-4 to 2.7e-3 s^-1 (worked
  // below). The run's readings are taken every minute but declared in seconds: its k reads 60 times
  // too large, over 30 times the band's top, and inside it per minute (common practice, no source).
  const T = 298.15;
  const kTrue = 2e10 * Math.exp(-75000 / (R * T)); // s^-1
  const perMinute = kTrue * 60;
  const readings = Array.from({ length: 31 }, (_, t) => [t, 5 + 15 * Math.exp(-perMinute * t)]);
  const settings = { kind: 'temperature-dependence', reference: { Ea: { min: 74, max: 76, unit: 'kJ mol^-1' }, A: { min: 1.5e10, max: 2.5e10, unit: 's^-1' } } };
  const measured = [288.15, 308.15].map((t) => ({ label: `${t} K`, temperature: { value: t, unit: 'K' }, k: { value: 2e10 * Math.exp(-75000 / (R * t)), unit: 's^-1' } }));
  const withRun = (timeUnit: string) => [...measured, { label: 'run', temperature: { value: T, unit: 'K' }, run: { timeUnit, readings, infinity: 5, reported: { k: { value: perMinute, unit: `${timeUnit}^-1` } } } }];

  it('the band by hand, and the run named on its time unit with minutes as the probable unit', () => {
    const top = 2.5e10 * Math.exp(-74000 / (R * T));
    expect(perMinute).toBeGreaterThan(30 * top);
    expect(kTrue).toBeLessThan(top);
    expect(kTrue).toBeGreaterThan(1.5e10 * Math.exp(-76000 / (R * T)));
    const result = checkSubmission(parseAssignment(settings), { studentId: 'T-TU', points: withRun('s') });
    const found = result.findings.filter((f) => f.code === 'time-unit-implausible');
    expect(found).toEqual([expect.objectContaining({ path: 'points[2].run.timeUnit', severity: 'warning', pointsLost: 0 })]);
    expect(found[0].message).toContain('the times were probably in min');
  });

  it('the same run declared in minutes draws nothing', () => {
    const result = checkSubmission(parseAssignment(settings), { studentId: 'T-TU', points: withRun('min') });
    expect(result.findings.filter((f) => f.code === 'time-unit-implausible')).toEqual([]);
  });
});
