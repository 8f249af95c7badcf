import { describe, expect, it } from 'vitest';
import { GAS_CONSTANT } from '../../server/engine/physical-constants.ts';
import { toKelvin } from '../../server/engine/temperature.ts';
import { fitArrhenius, fitEyring } from '../../kinds/temperature-dependence/activation-fits.ts';
import { caught } from '../support/thrown.ts';

const near = (value: number, reference: number, relative = 1e-8) => expect(Math.abs(value / reference - 1)).toBeLessThan(relative);

// Invented temperatures, 15 to 55 C.
const T = [288.15, 298.15, 308.15, 318.15, 328.15];

describe('temperatures', () => {
  it('reads kelvin and degrees Celsius (0 degC = 273.15 K by definition), and refuses C alone and absolute zero', () => {
    expect(toKelvin(25, 'degC')).toBeCloseTo(298.15, 12);
    expect(toKelvin(25, '°C')).toBeCloseTo(298.15, 12);
    expect(toKelvin(310.5, 'K')).toBe(310.5);
    expect(caught(() => toKelvin(25, 'C'))).toMatchObject({ code: 'unknown-unit' });
    expect(caught(() => toKelvin(-273.15, 'degC'))).toMatchObject({ code: 'not-above-absolute-zero' });
  });

  it('uses R = N_A k_B from the exact SI constants (CODATA 2018: 8.314462618... J K^-1 mol^-1)', () => {
    near(GAS_CONSTANT, 8.314462618, 1e-10);
  });
});

describe('Arrhenius and Eyring fits', () => {
  it('recover Ea and A exactly from noise-free rate constants', () => {
    const Ea = 75_000;
    const A = 1e10;
    const fit = fitArrhenius(T.map((t) => ({ temperature: t, k: A * Math.exp(-Ea / (GAS_CONSTANT * t)) })), { kUnit: 's^-1' });
    near(fit.Ea.value, Ea, 1e-12);
    near(fit.A.value, A, 1e-10);
    expect(fit.Ea.unit).toBe('J mol^-1');
    expect(fit.A.unit).toBe('s^-1');
  });

  it('agree with numpy on a noisy set, ordinary and weighted by SE(ln k)', () => {
    // Invented k (s^-1) with a few per cent scatter. Reference: numpy.polyfit 1.24.2 (deg 1; cov=True
    // for the ordinary fit, w = k/SE(k) and cov='unscaled' for the weighted one) on ln k and ln(k/T)
    // against 1/T, with R, k_B and h from scipy.constants 1.10.1 (CODATA 2018).
    const k = [1.62e-4 * 1.03, 4.24e-4 * 0.97, 1.05e-3 * 1.02, 2.49e-3 * 0.99, 5.63e-3 * 1.01];
    const se = [0.05e-4, 0.12e-4, 0.03e-3, 0.08e-3, 0.2e-3];
    const points = T.map((t, i) => ({ temperature: t, k: k[i], standardError: se[i] }));
    const arrhenius = fitArrhenius(points, { kUnit: 's^-1' });
    const eyring = fitEyring(points);
    near(arrhenius.Ea.value, 69567.98685136587);
    near(arrhenius.Ea.standardError, 820.0295156479785);
    near(arrhenius.A.value, 660365809.1279595);
    near(arrhenius.A.standardError, 212028215.4903091);
    near(eyring.dH.value, 67013.89689662705);
    near(eyring.dH.standardError, 800.4444570198274);
    near(eyring.dS.value, -84.64276908202525);
    near(eyring.dS.standardError, 2.605823408357884);
    const weighted = fitArrhenius(points, { kUnit: 's^-1', weighted: true });
    const weightedEyring = fitEyring(points, { weighted: true });
    near(weighted.Ea.value, 69506.95338370882);
    near(weighted.Ea.standardError, 795.9336632453226);
    near(weightedEyring.dH.value, 66957.73339194946);
    near(weightedEyring.dS.value, -84.8339102310975);
    near(weightedEyring.dS.standardError, 2.6036850731182293);
    // dH is close to Ea - R T at the mean temperature (the two plots differ by ln T): a check of the form.
    expect(Math.abs(eyring.dH.value - (arrhenius.Ea.value - GAS_CONSTANT * 308.15))).toBeLessThan(100);
  });

  it('gives the activation energy of a published textbook exercise', () => {
    // Published data: N2O5 decomposition, T = 338, 318, 298 K, k = 4.9e-3, 5.0e-4, 3.5e-5 s^-1 (an
    // end-of-chapter problem of a general-chemistry textbook, as posted on a public homework-help page).
    // The least-squares Ea is 103.49 kJ/mol by numpy.polyfit (as above); the usual quoted value for
    // this reaction is about 1.0e2 kJ/mol [memory].
    const fit = fitArrhenius(
      [[338, 4.9e-3], [318, 5.0e-4], [298, 3.5e-5]].map(([temperature, k]) => ({ temperature, k })),
      { kUnit: 's^-1' },
    );
    near(fit.Ea.value, 103490.39649590092);
    near(fit.Ea.standardError, 797.7392285943082);
    expect(fit.Ea.value / 1000).toBeGreaterThan(95);
    expect(fit.Ea.value / 1000).toBeLessThan(110);
  });

  it('refuses what has no logarithm or no weight, naming the point', () => {
    expect(caught(() => fitArrhenius([{ temperature: 300, k: 0 }, { temperature: 310, k: 1 }, { temperature: 320, k: 2 }], { kUnit: 's^-1' }))).toMatchObject({ code: 'non-positive-rate', field: 'points[0].k' });
    expect(caught(() => fitEyring([{ temperature: 300, k: 1 }, { temperature: 310, k: 2 }, { temperature: 320, k: 3 }], { weighted: true }))).toMatchObject({ code: 'bad-weight', field: 'points[0].standardError' });
  });
});

describe('two temperatures', () => {
  it('give the line through both points exactly, by the two-point Arrhenius relation E_a = R ln(k2/k1)/(1/T1 - 1/T2) (textbook algebra), with standard errors not defined', () => {
    // Invented: k = 2.0e-4 s^-1 at 300 K and 8.0e-4 s^-1 at 320 K.
    const points = [
      { temperature: 300, k: 2.0e-4, standardError: 1e-5 },
      { temperature: 320, k: 8.0e-4, standardError: 2e-5 },
    ];
    const Ea = (GAS_CONSTANT * Math.log(4)) / (1 / 300 - 1 / 320);
    for (const weighted of [false, true]) {
      const fit = fitArrhenius(points, { kUnit: 's^-1', weighted });
      near(fit.Ea.value, Ea, 1e-12);
      near(fit.A.value, 2.0e-4 * Math.exp(Ea / (GAS_CONSTANT * 300)), 1e-10);
      expect(Number.isNaN(fit.Ea.standardError)).toBe(true);
      expect(fit.Ea.ci95.every(Number.isNaN)).toBe(true);
      expect(fit.line.dof).toBe(0);
      const eyring = fitEyring(points, { weighted });
      near(eyring.dH.value, (GAS_CONSTANT * Math.log(8.0e-4 / 320 / (2.0e-4 / 300))) / (1 / 300 - 1 / 320), 1e-12);
      expect(Number.isNaN(eyring.dS.standardError)).toBe(true);
    }
  });

  it('at one temperature twice are refused: no slope', () => {
    expect(caught(() => fitArrhenius([{ temperature: 300, k: 1e-3 }, { temperature: 300, k: 2e-3 }], { kUnit: 's^-1' }))).toMatchObject({ code: 'degenerate-x' });
  });
});
