import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { tCritical95, tCriticalTwoSided } from '../../server/engine/student-t.ts';
import { T_CRITICAL_TWO_SIDED } from '../../server/engine/t-critical-table.ts';

// The package the table was written from (@stdlib/stats-base-dists-t-quantile, npm registry).
const quantile = createRequire(import.meta.url)('@stdlib/stats-base-dists-t-quantile') as (p: number, dof: number) => number;

describe('the table of two-sided t critical values', () => {
  it.each([0.05, 0.001])('holds the package value at p = %s for every degree of freedom from 1 to 120, to the last bit', (p) => {
    const table = T_CRITICAL_TWO_SIDED.get(p) ?? [];
    expect(table).toHaveLength(120);
    table.forEach((t, i) => expect(t).toBe(quantile(1 - p / 2, i + 1)));
  });

  it('is what tCriticalTwoSided gives there; past it, and at other levels, the package computes the value', () => {
    expect(tCritical95(14)).toBe(T_CRITICAL_TWO_SIDED.get(0.05)?.[13]);
    expect(tCritical95(121)).toBe(quantile(0.975, 121));
    expect(tCritical95(2.5)).toBe(quantile(0.975, 2.5));
    expect(tCriticalTwoSided(0.01, 10)).toBe(quantile(0.995, 10));
  });
});
