import { describe, expect, it } from 'vitest';
import { varianceRatioP } from '../../../kinds/reaction-order/variance-ratio.ts';

// scipy 1.17.1 scipy.stats.f.sf(ratio, dof, dof), computed outside the project.
const SCIPY: Array<[ratio: number, dof: number, p: number]> = [
  [10, 4, 0.02329075882794891],
  [2, 10, 0.14484580602550423],
  [1.5, 20, 0.18609202141541176],
];

describe('the tail of the variance ratio', () => {
  it.each(SCIPY)('P(F(%d) >= ratio) with (dof, dof) = scipy’s f.sf to 1e-9', (ratio, dof, p) => {
    expect(Math.abs(varianceRatioP(ratio, dof) - p) / p).toBeLessThan(1e-9);
  });

  it('is 1 for a ratio of no size and 0 for an endless one', () => {
    expect(varianceRatioP(0, 5)).toBe(1);
    expect(varianceRatioP(Infinity, 5)).toBe(0);
  });
});
