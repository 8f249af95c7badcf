import { describe, expect, it } from 'vitest';
import { durbinWatson, durbinWatsonBelow, durbinWatsonNull } from '../../server/engine/durbin-watson.ts';
import { gaussian, seededRandom } from '../../server/demo/seeded-random.ts';

/** The design of a straight line y = a + b x at x = 1..n: its columns and (X'X)^-1. */
function lineDesign(n: number) {
  const ones = new Array<number>(n).fill(1);
  const x = Array.from({ length: n }, (_, i) => i + 1);
  const sx = x.reduce((a, b) => a + b, 0);
  const sxx = x.reduce((a, b) => a + b * b, 0);
  const det = n * sxx - sx * sx;
  return { x, jacobian: [ones, x], normalInverse: [sxx / det, -sx / det, -sx / det, n / det] };
}

/** Residuals of the least-squares line through (x, y). */
function lineResiduals(x: number[], y: number[]): number[] {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n;
  const my = y.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  const b = sxy / sxx;
  return y.map((v, i) => v - my - b * (x[i] - mx));
}

/** The statistic at which the lower tail reaches `p`, by bisection on [0, 4]. */
function criticalValue(lowerTail: (d: number) => number, p: number): number {
  let lo = 0;
  let hi = 4;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (lowerTail(mid) < p) lo = mid;
    else hi = mid;
  }
  return lo;
}

describe('Durbin-Watson statistic', () => {
  it('is the sum of squared successive differences over the sum of squares', () => {
    const { jacobian, normalInverse } = lineDesign(5);
    // Differences -1, -1, 2, -2: (1 + 1 + 4 + 4) / (1 + 0 + 1 + 1 + 1), by hand.
    expect(durbinWatson([1, 0, -1, 1, -1], jacobian, normalInverse).statistic).toBeCloseTo(10 / 4, 12);
  });

  // Bounds of the 5 % critical value for a line with intercept and one regressor (Savin and White's
  // extension of Durbin and Watson's table, from memory): the exact critical value for any such design
  // lies between d_L and d_U, here to the table's last place (0.005).
  it.each([
    [15, 1.08, 1.36],
    [20, 1.2, 1.41],
    [30, 1.35, 1.49],
    [40, 1.44, 1.54],
  ])('puts the 5 per cent critical value for a line through %i points between the tabulated bounds %s and %s', (n, dL, dU) => {
    const { jacobian, normalInverse } = lineDesign(n);
    const d = criticalValue(durbinWatsonNull(jacobian, normalInverse).lowerTail, 0.05);
    expect(d).toBeGreaterThanOrEqual(dL - 0.005);
    expect(d).toBeLessThanOrEqual(dU + 0.005);
  });

  it('matches the mean, variance and tail of d for independent normal scatter, by simulation', () => {
    const n = 16;
    const { x, jacobian, normalInverse } = lineDesign(n);
    const nullDistribution = durbinWatsonNull(jacobian, normalInverse);
    const random = seededRandom(4);
    const trials = 20000;
    const ds: number[] = [];
    for (let i = 0; i < trials; i++) {
      const y = x.map((v) => 3 + 0.5 * v + gaussian(random));
      ds.push(durbinWatson(lineResiduals(x, y), jacobian, normalInverse).statistic);
    }
    const mean = ds.reduce((a, b) => a + b, 0) / trials;
    const variance = ds.reduce((a, b) => a + (b - mean) ** 2, 0) / (trials - 1);
    expect(mean).toBeCloseTo(nullDistribution.expected, 2);
    expect(variance / nullDistribution.variance).toBeGreaterThan(0.95);
    expect(variance / nullDistribution.variance).toBeLessThan(1.05);
    // Binomial SD of a 5 % share of 20,000 is 0.0015; of a 1 % share 0.0007.
    const share = (p: number) => ds.filter((d) => nullDistribution.lowerTail(d) < p).length / trials;
    expect(Math.abs(share(0.05) - 0.05)).toBeLessThan(0.006);
    expect(Math.abs(share(0.01) - 0.01)).toBeLessThan(0.003);
  });

  it('gives a small tail probability to residuals that drift in one direction, and not to alternating ones', () => {
    const { jacobian, normalInverse } = lineDesign(16);
    const wave = Array.from({ length: 16 }, (_, i) => Math.sin((i / 15) * 2 * Math.PI));
    expect(durbinWatson(wave, jacobian, normalInverse).pValue).toBeLessThan(1e-4);
    const alternating = Array.from({ length: 16 }, (_, i) => (i % 2 ? 1 : -1));
    expect(durbinWatson(alternating, jacobian, normalInverse).pValue).toBeGreaterThan(0.99);
  });

  it.each([1e-4, 1e-3, 0.05, 0.5])('skips the tail probability only where it is surely at least %s: every skipped statistic has at least that tail', (level) => {
    let skippedAbove = 0;
    let checked = 0;
    for (const n of [6, 8, 12, 16, 30, 60]) {
      const { jacobian, normalInverse } = lineDesign(n);
      const nullDistribution = durbinWatsonNull(jacobian, normalInverse);
      const critical = criticalValue(nullDistribution.lowerTail, level);
      for (let d = 0.01; d < 4; d += 0.01) {
        if (!nullDistribution.tailAtLeast(d, level)) continue;
        checked++;
        expect(nullDistribution.lowerTail(d)).toBeGreaterThanOrEqual(level);
        if (d > critical) skippedAbove++;
      }
    }
    // Most statistics the exact tail puts at or past the level are known to be without it.
    expect(checked).toBeGreaterThan(800);
    expect(skippedAbove).toBe(checked);
  });

  it('evaluates the tail where it may be under the level: a drift that is under it gets its exact p, alternating scatter is not tested', () => {
    let skipped = 0;
    let under = 0;
    for (const n of [6, 8, 12, 16, 30, 60]) {
      const { jacobian, normalInverse } = lineDesign(n);
      const wave = Array.from({ length: n }, (_, i) => Math.sin((i / (n - 1)) * 2 * Math.PI));
      const alternating = Array.from({ length: n }, (_, i) => (i % 2 ? 1 : -1));
      if (durbinWatsonBelow(1e-4, alternating, jacobian, normalInverse) === undefined) skipped++;
      const exact = durbinWatson(wave, jacobian, normalInverse).pValue;
      const screened = durbinWatsonBelow(1e-4, wave, jacobian, normalInverse);
      if (exact < 1e-4) {
        under++;
        expect(screened?.pValue).toBe(exact);
      } else if (screened) expect(screened.pValue).toBe(exact);
    }
    expect(skipped).toBe(6);
    expect(under).toBeGreaterThanOrEqual(3);
  });
});
