import { describe, expect, it } from 'vitest';
import { estimate } from '../../kinds/first-order-catalysis/equilibrium.ts';
import { constantApartSignals } from '../../kinds/first-order-catalysis/checks/equilibrium-signals.ts';
import type { EquilibriumRefit } from '../../kinds/first-order-catalysis/schemas.ts';

/** Four runs' K with their SEs; x_B and [α] are not read by the signal. */
function refitOf(Ks: Array<[number, number]>): EquilibriumRefit {
  return {
    runs: Ks.map(([K, se], i) => ({ label: `run ${i}`, specificRotation: estimate(52.7, 0.01, 'deg mL g^-1 dm^-1'), xB: estimate(K / (1 + K), 0.001, '1'), K: estimate(K, se, '1') })),
  };
}

describe('a run whose K stands apart (constant-apart)', () => {
  it('signals the run, with z worked by hand', () => {
    // Others 1.75 ± 0.002 each: mean 1.75, its SE sqrt(3 x 0.002^2)/3 = 0.0011547; z = (1.62 − 1.75)/hypot(0.002, 0.0011547) = −56.29.
    const signals = constantApartSignals(refitOf([[1.75, 0.002], [1.75, 0.002], [1.75, 0.002], [1.62, 0.002]]));
    expect(signals.map((s) => s.path)).toEqual(['runs[3].infinity']);
    expect(signals[0].evidence.z).toBeCloseTo(-56.29, 2);
    expect(signals[0].evidence.othersMeanSE).toBeCloseTo(0.0011547, 7);
  });

  it('stays quiet within the uncertainties: z = (1.745 − 1.75)/0.0023094 = −2.17, under 3.29', () => {
    expect(constantApartSignals(refitOf([[1.75, 0.002], [1.75, 0.002], [1.75, 0.002], [1.745, 0.002]]))).toEqual([]);
  });

  it('stays quiet for a difference under 1 % of K, however many SEs it is', () => {
    // 1.74 against 1.75: 0.57 %, though z = −0.01/hypot(0.0001, 0.0000577) = −86.6.
    expect(constantApartSignals(refitOf([[1.75, 0.0001], [1.75, 0.0001], [1.75, 0.0001], [1.74, 0.0001]]))).toEqual([]);
  });

  it('needs three runs with a K', () => {
    expect(constantApartSignals(refitOf([[1.75, 0.002], [1.5, 0.002]]))).toEqual([]);
  });
});

describe('two runs apart among five', () => {
  it('signals both, each judged against the runs that agree', () => {
    // 1.62 first (furthest), then 1.85 against the three at 1.75: z = 0.1/hypot(0.002, 0.0011547) = 43.3.
    const signals = constantApartSignals(refitOf([[1.75, 0.002], [1.62, 0.002], [1.75, 0.002], [1.85, 0.002], [1.75, 0.002]]));
    expect(signals.map((s) => s.path)).toEqual(['runs[1].infinity', 'runs[3].infinity']);
    expect(signals[1].evidence.z).toBeCloseTo(43.30, 2);
  });
});
