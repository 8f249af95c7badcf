import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

/**
 * The kind `temperature-dependence` on invented data: E_a = 75 kJ/mol and A = 2e10 s^-1 at six
 * temperatures from 15 to 40 degC, with 1 % scatter in k. Every reported value here is computed in
 * this file by plain least squares, apart from the engine, with or without one slip; each slip must
 * be named by its code at its place, and clean work must get no finding.
 */
const R = 8.314462618; // J K^-1 mol^-1, N_A k_B (exact in the SI since 2019)
const LN_KB_OVER_H = Math.log(1.380649e-23 / 6.62607015e-34);
const celsius = [15, 20, 25, 30, 35, 40];
const scatter = [1.008, 0.993, 1.004, 0.99, 1.01, 0.996];
const kelvin = celsius.map((t) => t + 273.15);
const ks = kelvin.map((T, i) => 2e10 * Math.exp(-75000 / (R * T)) * scatter[i]);

/** Slope and intercept of the least-squares line through (x, y). */
function line(x: number[], y: number[]): { slope: number; intercept: number } {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
  return { slope, intercept: my - slope * mx };
}

interface Work {
  T?: number[];
  lnY?: (k: number, T: number) => number;
  R?: number;
  xScale?: number;
  lnKbOverH?: number;
  kScale?: number;
}

/** What a student computes, in J/mol, s^-1 and J/(K mol), by the method with the slips in `w`. */
function studentValues(w: Work = {}) {
  const T = w.T ?? kelvin;
  const r = w.R ?? R;
  const x = T.map((t) => (w.xScale ?? 1) / t);
  const k = ks.map((v) => v * (w.kScale ?? 1));
  const arr = line(x, k.map((v, i) => (w.lnY ? w.lnY(v, T[i]) : Math.log(v))));
  const eyr = line(x, k.map((v, i) => (w.lnY ? w.lnY(v / T[i], T[i]) : Math.log(v / T[i]))));
  return { Ea: -arr.slope * r, A: Math.exp(arr.intercept), dH: -eyr.slope * r, dS: r * (eyr.intercept - (w.lnKbOverH ?? LN_KB_OVER_H)) };
}

const assignment = parseAssignment({ kind: 'temperature-dependence' });
const points = celsius.map((t, i) => ({ label: `${t} °C`, temperature: i % 2 ? { value: t, unit: 'degC' } : { value: kelvin[i], unit: 'K' }, k: { value: ks[i], unit: 's^-1' } }));

function submit(v: ReturnType<typeof studentValues>, eaSE = 2.1) {
  return checkSubmission(assignment, {
    studentId: 'T-01',
    points,
    reported: {
      Ea: { value: (v.Ea / 1000).toPrecision(4), uncertainty: eaSE, unit: 'kJ mol^-1' },
      A: { value: v.A.toPrecision(3), unit: 's^-1' },
      dH: { value: (v.dH / 1000).toPrecision(4), unit: 'kJ/mol' },
      dS: { value: v.dS.toPrecision(4), unit: 'J K^-1 mol^-1' },
    },
  });
}
const codesAt = (result: ReturnType<typeof submit>) => result.findings.filter((f) => f.pointsLost > 0 || f.severity === 'error').map((f) => `${f.code}@${f.path}`);

describe('temperature dependence: the refit', () => {
  it('agrees with an independent least-squares fit, temperatures in K and degC alike', () => {
    const result = submit(studentValues());
    const refit = result.refit as { Ea: { value: number; unit: string }; dH: { value: number }; dS: { value: number }; A: { value: number } };
    const ours = studentValues();
    expect(refit.Ea.unit).toBe('kJ mol^-1');
    expect(refit.Ea.value).toBeCloseTo(ours.Ea / 1000, 8);
    expect(refit.dH.value).toBeCloseTo(ours.dH / 1000, 8);
    expect(refit.dS.value).toBeCloseTo(ours.dS, 6);
    expect(refit.A.value / ours.A).toBeCloseTo(1, 8);
    // dH = Ea - R T near the middle of the range (from Ea = dH + RT for a unimolecular step in solution: common practice, no source).
    expect(ours.Ea - ours.dH).toBeGreaterThan(R * 290);
    expect(ours.Ea - ours.dH).toBeLessThan(R * 310);
  });

  it('finds nothing wrong in clean work', () => {
    const se = (submit(studentValues()).refit as { Ea: { standardError: number } }).Ea.standardError;
    const result = submit(studentValues(), Number(se.toPrecision(2)));
    expect(result.findings).toEqual([]);
    expect(result.score).toBe(result.maxScore);
    expect(result.maxScore).toBe(8);
  });
});

describe('temperature dependence: each slip is named at its place', () => {
  const se = (submit(studentValues()).refit as { Ea: { standardError: number } }).Ea.standardError;
  const check = (w: Work, change?: (v: ReturnType<typeof studentValues>) => void) => {
    const v = studentValues(w);
    change?.(v);
    return codesAt(submit(v, Number(se.toPrecision(2))));
  };

  it('temperatures in degrees Celsius in 1/T', () => {
    expect(check({ T: celsius })).toEqual(['temperature-scale@reported.Ea', 'temperature-scale@reported.A', 'temperature-scale@reported.dH', 'temperature-scale@reported.dS']);
  });

  it('log10 for ln', () => {
    expect(check({ lnY: (k) => Math.log10(k) })).toEqual(['log-base@reported.Ea', 'log-base@reported.A', 'log-base@reported.dH', 'log-base@reported.dS']);
  });

  it('R in calories with energies in joules', () => {
    expect(check({ R: 1.987 })).toEqual(['gas-constant@reported.Ea', 'gas-constant@reported.dH', 'gas-constant@reported.dS']);
  });

  it('R in L atm with energies in joules', () => {
    expect(check({ R: 0.08206 })).toEqual(['gas-constant@reported.Ea', 'gas-constant@reported.dH', 'gas-constant@reported.dS']);
  });

  it('joules written as kilojoules, kilojoules as joules where 1000/T cannot explain it, and a calorie conversion the wrong way', () => {
    expect(check({}, (v) => (v.Ea *= 1000))).toEqual(['energy-unit@reported.Ea']);
    expect(check({}, (v) => (v.dS /= 1000))).toEqual(['energy-unit@reported.dS']);
    expect(check({}, (v) => (v.dH *= 4.184))).toEqual(['energy-unit@reported.dH']);
  });

  it('kilojoules converted to kilocalories the wrong way (x 4.184) and labelled kcal: named once, at E_a, its SE not charged again', () => {
    // Read as kcal, 4.184 x E_a is 4.184^2 = 17.506 times the refit in kJ; the SE carries the same slip.
    // 4.184 J per thermochemical calorie (its definition).
    const v = studentValues();
    const result = checkSubmission(assignment, {
      studentId: 'T-01',
      points,
      reported: {
        Ea: { value: ((v.Ea / 1000) * 4.184).toPrecision(4), uncertainty: (se * 4.184).toPrecision(2), unit: 'kcal mol^-1' },
        A: { value: v.A.toPrecision(3), unit: 's^-1' },
        dH: { value: (v.dH / 1000).toPrecision(4), unit: 'kJ/mol' },
        dS: { value: v.dS.toPrecision(4), unit: 'J K^-1 mol^-1' },
      },
    });
    expect(result.findings.map((f) => `${f.code}@${f.path} -${f.pointsLost}`)).toEqual(['energy-unit@reported.Ea -2', 'energy-unit@reported.Ea.uncertainty -0']);
    expect(result.score).toBe(result.maxScore! - 2);
  });

  it('but the conversion the right way (/ 4.184) labelled kcal is right, and 4.184^2 times E_a labelled kJ is no calorie slip', () => {
    const v = studentValues();
    const withEa = (value: number, unit: string) =>
      codesAt(
        checkSubmission(assignment, {
          studentId: 'T-01',
          points,
          reported: { Ea: { value: value.toPrecision(4), uncertainty: se.toPrecision(2), unit }, A: { value: v.A.toPrecision(3), unit: 's^-1' }, dH: { value: (v.dH / 1000).toPrecision(4), unit: 'kJ/mol' }, dS: { value: v.dS.toPrecision(4), unit: 'J K^-1 mol^-1' } },
        }),
      ).filter((c) => c.endsWith('@reported.Ea'));
    expect(withEa(v.Ea / 1000 / 4.184, 'kcal mol^-1')).toEqual([]);
    expect(withEa((v.Ea / 1000) * 4.184 * 4.184, 'kJ mol^-1')).not.toContain('energy-unit@reported.Ea');
  });

  it("the slope's sign kept", () => {
    expect(check({}, (v) => (v.Ea = -v.Ea))).toEqual(['sign-flipped@reported.Ea']);
  });

  it('a reversed ΔS‡ is named as a slip in the intercept, E_a as one in the slope', () => {
    // ΔS‡ = R (intercept − ln(k_B/h)) and E_a = −R × slope (the Eyring and Arrhenius forms: common practice, no source).
    const v = studentValues();
    v.dS = -v.dS;
    const result = submit(v, Number(se.toPrecision(2)));
    const dS = result.findings.find((f) => f.path === 'reported.dS')!;
    expect(dS.code).toBe('sign-flipped');
    expect(dS.message).toContain('intercept');
    expect(dS.message).not.toContain('slope');
    const w = studentValues();
    w.Ea = -w.Ea;
    expect(submit(w, Number(se.toPrecision(2))).findings.find((f) => f.path === 'reported.Ea')!.message).toContain('slope of ln k against 1/T');
  });

  it('1000/T read as 1/T', () => {
    expect(check({ xScale: 1000 }, (v) => ((v.A = studentValues().A), (v.dS = studentValues().dS)))).toEqual(['reciprocal-scale@reported.Ea', 'reciprocal-scale@reported.dH']);
  });

  it('ln k in place of ln(k/T) in the Eyring plot, and ln(k_B/h) taken as its log10', () => {
    expect(check({ lnY: (kOverT, T) => Math.log(kOverT * T) }, (v) => ((v.Ea = studentValues().Ea), (v.A = studentValues().A)))).toEqual(['eyring-form@reported.dH', 'eyring-form@reported.dS']);
    expect(check({ lnKbOverH: Math.log10(1.380649e-23 / 6.62607015e-34) })).toEqual(['eyring-form@reported.dS']);
  });

  it('k per minute where per second was needed for the entropy', () => {
    expect(check({ kScale: 60 }, (v) => ((v.Ea = studentValues().Ea), (v.A = studentValues().A)))).toEqual(['time-unit@reported.dS']);
  });

  it('scores a systematic slip once: the gas constant costs at E_a, not again at ΔH‡ and ΔS‡', () => {
    const v = studentValues({ R: 1.987 });
    const result = submit(v, Number(se.toPrecision(2)));
    expect(result.findings.filter((f) => f.code === 'gas-constant').map((f) => f.pointsLost)).toEqual([2, 0, 0]);
  });
});

describe('temperature dependence: reference bands', () => {
  it('warns, without points, when a right E_a lies outside the band the instructor expects', () => {
    const banded = parseAssignment({ kind: 'temperature-dependence', reference: { Ea: { min: 20, max: 60, unit: 'kJ/mol' } } });
    const v = studentValues();
    const result = checkSubmission(banded, { studentId: 'T-02', points, reported: { Ea: { value: (v.Ea / 1000).toPrecision(4), uncertainty: 2.1, unit: 'kJ mol^-1' } } });
    expect(result.findings.filter((f) => f.code === 'implausible')).toEqual([expect.objectContaining({ path: 'reported.Ea', severity: 'warning', pointsLost: 0 })]);
    expect(() => parseAssignment({ kind: 'temperature-dependence', reference: { Ea: { min: 20, max: 60, unit: 'J/K/mol' } } })).toThrow();
  });
});

describe('temperature dependence: data the fit cannot use', () => {
  it('names the field: a measured k without its uncertainty in a weighted fit, and a k below zero', () => {
    const measured = celsius.slice(0, 3).map((t, i) => ({ label: `${t} °C`, temperature: { value: t, unit: 'degC' }, k: { value: ks[i], ...(i === 1 ? {} : { uncertainty: ks[i] / 100 }), unit: 's^-1' } }));
    const weighted = parseAssignment({ kind: 'temperature-dependence', fit: 'weighted' });
    expect(checkSubmission(weighted, { studentId: 'T-04', points: measured }).rejected).toEqual([{ path: 'points[1].k.uncertainty', message: 'point 1 has no standard error for a weighted fit' }]);
    const negative = measured.map((p, i) => (i === 2 ? { ...p, k: { value: -ks[2], unit: 's^-1' } } : p));
    expect(checkSubmission(assignment, { studentId: 'T-04', points: negative }).rejected).toEqual([{ path: 'points[2].k.value', message: `point 2 has k = ${-ks[2]}` }]);
  });
});

