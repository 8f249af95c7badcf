import { describe, expect, it } from 'vitest';
import { fitCatalysisLaw } from '../../kinds/first-order-catalysis/catalysis-law.ts';
import { fitLine } from '../../server/engine/linear-fit.ts';
import { thrown } from '../support/thrown.ts';

// Plausibility scale only: glucose mutarotation at 25 C, k_N = 0.0221 min^-1 and
// k_H = 0.594 M^-1 min^-1 in natural-log units (from memory, in test/reference/
// kinetics-check-values.md). The checks below are of the fit, not of these values.
const kN = 0.0221;
const kA = 0.594;
const acid = [0.05, 0.1, 0.2, 0.4];
const units = { concentration: 'M', time: 'min' };

describe('k_obs = k_N + k_A [H+]', () => {
  it('recovers k_N and k_A from exact k_obs, with units', () => {
    const fit = fitCatalysisLaw(acid.map((c) => ({ concentration: c, k: kN + kA * c })), { units });
    expect(fit.kN.value).toBeCloseTo(kN, 14);
    expect(fit.kA.value).toBeCloseTo(kA, 13);
    expect(fit.kN.unit).toBe('min^-1');
    expect(fit.kA.unit).toBe('M^-1 min^-1');
    expect(fit.weighted).toBe(false);
  });

  it('ordinary fit: standard errors and intervals are those of the straight line', () => {
    const k = [0.0521, 0.0810, 0.1405, 0.2601];
    const fit = fitCatalysisLaw(acid.map((c, i) => ({ concentration: c, k: k[i] })), { units });
    const line = fitLine(acid, k);
    expect(fit.kA.standardError).toBe(line.seSlope);
    expect(fit.kN.standardError).toBe(line.seIntercept);
    expect(fit.kA.ci95).toEqual(line.ci95.slope);
  });

  it('weighted fit: equal standard errors give the unweighted estimates; unequal ones pull toward the precise points', () => {
    const k = [0.0521, 0.0810, 0.1405, 0.2601];
    const equal = fitCatalysisLaw(acid.map((c, i) => ({ concentration: c, k: k[i], standardError: 0.002 })), { units, weighted: true });
    const plain = fitCatalysisLaw(acid.map((c, i) => ({ concentration: c, k: k[i] })), { units });
    expect(equal.kA.value).toBeCloseTo(plain.kA.value, 12);
    // With absolute sigma = 0.002 the slope's SE is sigma / sqrt(Sxx).
    const mean = acid.reduce((a, b) => a + b) / acid.length;
    const sxx = acid.reduce((a, c) => a + (c - mean) ** 2, 0);
    expect(equal.kA.standardError).toBeCloseTo(0.002 / Math.sqrt(sxx), 12);

    // The last point made very imprecise: the weighted slope follows the first three.
    const se = [0.001, 0.001, 0.001, 1];
    const weighted = fitCatalysisLaw(acid.map((c, i) => ({ concentration: c, k: k[i], standardError: se[i] })), { units, weighted: true });
    const firstThree = fitLine(acid.slice(0, 3), k.slice(0, 3));
    expect(weighted.kA.value).toBeCloseTo(firstThree.slope, 4);
  });

  it('weighted fit: both conventions for the standard errors, against scipy', () => {
    // Invented k_obs scattering far more than their SEs. Reference: numpy.polyfit 1.24.2 (Debian
    // python3-numpy), deg 1, w = 1/SE, cov='unscaled' (SE taken as absolute) and cov=True (scaled by
    // the reduced chi-square); scipy.optimize.curve_fit 1.10.1 with absolute_sigma True/False agrees
    // to its convergence, 1e-7.
    const c = [0.05, 0.1, 0.15, 0.2, 0.25];
    const k = [0.0121, 0.0205, 0.0319, 0.0387, 0.0501];
    const se = [0.0001, 0.00012, 0.00011, 0.00015, 0.00013];
    const fit = fitCatalysisLaw(c.map((x, i) => ({ concentration: x, k: k[i], standardError: se[i] })), { units, weighted: true });
    const near = (value: number, reference: number) => expect(Math.abs(value / reference - 1)).toBeLessThan(1e-8);
    near(fit.kN.value, 0.0024707048587445128);
    near(fit.kA.value, 0.18898534531520966);
    near(fit.kN.standardError, 0.00011383002734567264);
    near(fit.kA.standardError, 0.0007460844807658717);
    near(fit.scaled!.kN.standardError, 0.0010804736785845182);
    near(fit.scaled!.kA.standardError, 0.0070818277238915844);
    // Reduced chi-square = (scaled SE / absolute SE)^2 by definition of the two conventions.
    near(fit.scaled!.reducedChiSquared, (0.0070818277238915844 / 0.0007460844807658717) ** 2);
    expect(fitCatalysisLaw(c.map((x, i) => ({ concentration: x, k: k[i] })), { units }).scaled).toBeUndefined();
  });

  it('converts nothing silently: millimolar concentrations give a per-mM slope', () => {
    const fit = fitCatalysisLaw(acid.map((c) => ({ concentration: c * 1000, k: kN + kA * c })), { units: { concentration: 'mM', time: 'min' } });
    expect(fit.kA.value).toBeCloseTo(kA / 1000, 15);
    expect(fit.kA.unit).toBe('mM^-1 min^-1');
  });

  it('a weighted fit needs every standard error', () => {
    const e = thrown(() => fitCatalysisLaw(acid.map((c) => ({ concentration: c, k: kN + kA * c })), { units, weighted: true }));
    expect([e.code, e.field]).toEqual(['bad-weight', 'points[0].standardError']);
  });
});
