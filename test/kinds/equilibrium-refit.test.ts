import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compositionOf, estimate, meanConstant, splitRate } from '../../kinds/first-order-catalysis/equilibrium.ts';
import type { EquilibriumRefit } from '../../kinds/first-order-catalysis/schemas.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { glucoseBlock } from '../support/glucose-equilibrium.ts';

const GLUCOSE = { a: 112.2, b: 18.7 };

describe('the equilibrium composition and the split of k', () => {
  it('gives glucose’s published equilibrium: [α]_eq +52.7 reads as x_B = 0.636 and K = 1.75', () => {
    // Published: α +112.2, β +18.7, equilibrium +52.7 deg mL g^-1 dm^-1 at 589 nm (Robyt 1998, ch. 3);
    // α_inf = 10.54 deg for c = 0.100 g/mL and l = 2 dm, and x_β = 0.636, K = 1.75 derived in
    // test/reference/kinetics-check-values.md. Published values differ by about 1 deg between authors.
    const c = compositionOf(10.54, 0.003, 2, 0.1, GLUCOSE);
    expect(c.specificRotation.value).toBeCloseTo(52.7, 6);
    expect(c.xB.value).toBeCloseTo(0.636, 3);
    expect(c.K!.value).toBeCloseTo(1.75, 2);
  });

  it('carries standard errors by first-order propagation (hand-worked)', () => {
    // Central differences in numpy 2.4.6 of [α], x_B, K, k K/(1+K), k/(1+K) in α_inf and k, added in
    // quadrature, for α_inf = 10.54 ± 0.003 deg, l = 2 dm, c = 0.1 g/mL, k = 0.0518 ± 0.00007 min^-1.
    const c = compositionOf(10.54, 0.003, 2, 0.1, GLUCOSE);
    const { kf, kr } = splitRate(estimate(0.0518, 7e-5, 'min^-1'), c.xB);
    const rows: Array<[string, number, number, number, number]> = [
      ['[α]_eq', c.specificRotation.value, c.specificRotation.standardError, 52.7, 1.4999999994e-2],
      ['x_B', c.xB.value, c.xB.standardError, 0.63636363636, 1.6042780737e-4],
      ['K', c.K!.value, c.K!.standardError, 1.75, 1.2132352932e-3],
      ['k_f', kf.value, kf.standardError, 3.2963636364e-2, 4.5313974522e-5],
      ['k_r', kr.value, kr.standardError, 1.8836363636e-2, 2.6776718443e-5],
    ];
    for (const [what, value, se, wantValue, wantSE] of rows) {
      expect(value, what).toBeCloseTo(wantValue, 9);
      expect(se / wantSE, `SE of ${what}`).toBeCloseTo(1, 6);
    }
    expect(kf.value + kr.value).toBeCloseTo(0.0518, 12);
    expect(kf.value / kr.value).toBeCloseTo(c.K!.value, 12);
  });

  it('computes no K from an x_B outside 0 to 1', () => {
    // l taken as 20 (cm read as dm): [α] = 5.27, below β's 18.7, x_B = (112.2 − 5.27)/93.5 = 1.1436 (hand-worked).
    const c = compositionOf(10.54, 0.003, 20, 0.1, GLUCOSE);
    expect(c.xB.value).toBeCloseTo(1.1436, 4);
    expect(c.K).toBeUndefined();
  });

  it('averages K over the runs with the sample SD as the spread (hand-worked)', () => {
    // numpy 2.4.6: mean(1.70, 1.75, 1.81) = 1.753333, std(ddof=1) = 0.0550757, / sqrt(3) = 0.0317980.
    const m = meanConstant([1.7, 1.75, 1.81].map((k) => estimate(k, 0.001, '1')))!;
    expect(m.value).toBeCloseTo(1.7533333, 6);
    expect(m.sd).toBeCloseTo(0.0550757, 6);
    expect(m.standardError).toBeCloseTo(0.031798, 6);
  });

  it('is refitted by the checker for every run of a four-run submission at glucose’s figures', () => {
    // The casebook's clean four runs: x_0 = 22.44, x_inf = 10.54 deg (the reference file's derived example).
    const clean = JSON.parse(readFileSync(join(import.meta.dirname, '../casebook/cases/foc-four-runs-clean.json'), 'utf8'));
    const result = checkSubmission(parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', equilibrium: glucoseBlock }), clean.submission);
    const eq = (result.refit as { equilibrium: EquilibriumRefit }).equilibrium;
    expect(eq.runs).toHaveLength(4);
    for (const run of eq.runs) {
      expect(run!.xB.value).toBeCloseTo(0.636, 3);
      expect(run!.K!.value).toBeCloseTo(1.75, 2);
      // k_f + k_r is the run's k_obs (the case's hand-worked origin fit).
      expect(run!.kf!.value + run!.kr!.value).toBeGreaterThan(0.05);
    }
    expect(eq.meanK!.value).toBeCloseTo(1.75, 2);
    // k_N = 0.0220996 min^-1 (the case's hand-worked line): k_N,f = 0.0220996 × 0.63636.
    expect(eq.kNf!.value).toBeCloseTo(0.0220996 * (7 / 11), 6);
    expect(eq.kAr!.value).toBeCloseTo(0.5940003 * (4 / 11), 5);
  });
});
