import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { logBeta, logGamma } from '../../server/engine/log-gamma.ts';

// stdlib's gammaln (@stdlib/math-base-special-gammaln, from the npm registry) as the reference library.
const gammaln = createRequire(import.meta.url)('@stdlib/math-base-special-gammaln') as (x: number) => number;

describe('ln Γ', () => {
  it('gives factorials and Γ(1/2) = √π (identities of the gamma function)', () => {
    expect(logGamma(1)).toBeCloseTo(0, 13);
    expect(logGamma(2)).toBeCloseTo(0, 13);
    expect(logGamma(10)).toBeCloseTo(Math.log(362880), 12);
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
  });

  it('agrees with a reference library to 1e-13 (relative, or absolute near the zeros at 1 and 2) from 0.01 to 10,000', () => {
    for (let x = 0.01; x < 10_000; x *= 1.07) {
      const ours = logGamma(x);
      const theirs = gammaln(x);
      expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(1e-13 * Math.max(1, Math.abs(theirs)));
    }
  });

  it('gives ln B(a, b) from three of them: B(2, 3) = 1/12', () => {
    expect(logBeta(2, 3)).toBeCloseTo(Math.log(1 / 12), 13);
  });

  it('refuses x that is not positive and finite', () => {
    expect(() => logGamma(0)).toThrow(RangeError);
    expect(() => logGamma(Number.NaN)).toThrow(RangeError);
  });
});
