import { describe, expect, it } from 'vitest';
import type { Estimate } from '../../server/engine/estimate.ts';
import { fitFirstOrderLinear } from '../../server/engine/first-order-linear.ts';
import { fitFirstOrderNonlinear } from '../../server/engine/first-order-nonlinear.ts';
import { fitGuggenheim } from '../../server/engine/guggenheim.ts';
import { minutes, syntheticReadings } from '../../server/demo/synthetic-run.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';

/**
 * Coverage of the reported 95 % intervals: on 1,000 seeded runs of known k, the share whose interval
 * contains k checks the standard errors themselves. Readings are rounded to 0.001 deg, the display of
 * a laboratory polarimeter (common practice, no source); x_inf is the exact value.
 */
const TRIALS = 1000;
const times = minutes(16);

type Method = (run: { times: number[]; readings: number[]; infinity: number; timeUnit: string }) => Estimate;
const methods: Record<string, Method> = {
  'exponential, x_inf fixed': (run) => fitFirstOrderNonlinear(run, { infinity: 'fixed' }).k,
  'exponential, x_inf fitted': (run) => fitFirstOrderNonlinear(run, { infinity: 'fitted' }).k,
  Guggenheim: (run) => fitGuggenheim(run).k,
  'linear, with an intercept': (run) => fitFirstOrderLinear(run, 'intercept').k,
  'linear, through the origin': (run) => fitFirstOrderLinear(run, 'origin').k,
};

function coverage(noise: number): Record<string, number> {
  const random = seededRandom(7);
  const hits = Object.fromEntries(Object.keys(methods).map((name) => [name, 0]));
  for (let trial = 0; trial < TRIALS; trial++) {
    const k = 0.01 + random() * 0.09;
    const x0 = 15 + random() * 10;
    const xInf = 5 + random() * 5;
    const readings = syntheticReadings({ k, x0, xInf, times, noise, resolution: 0.001, random });
    const run = { times, readings, infinity: xInf, timeUnit: 'min' };
    for (const [name, method] of Object.entries(methods)) {
      const { ci95 } = method(run);
      if (ci95[0] <= k && k <= ci95[1]) hits[name]++;
    }
  }
  return Object.fromEntries(Object.entries(hits).map(([name, h]) => [name, h / TRIALS]));
}

describe('95 % intervals of k contain the true k in at least 94 % of 1,000 seeded runs', () => {
  // The linearised fits are printed, not held to 94 %: ln F weighs late readings (small x - x_inf)
  // as much as early ones although they carry more noise, and the origin model takes x_0 as exact,
  // so a rounding error in x_0 shifts every ln F alike and its interval is far too narrow.
  // The models that treat every reading alike are held to the mark.
  const assessed = ['exponential, x_inf fixed', 'exponential, x_inf fitted', 'Guggenheim'];

  it.each([
    ['rounded to 0.001 deg', 0],
    ['with noise of SD 0.003 deg, then rounded', 0.003],
  ])('readings %s', (_, noise) => {
    const shares = coverage(noise);
    console.log(`coverage, readings ${_}:`, shares);
    for (const name of assessed) expect(shares[name], name).toBeGreaterThanOrEqual(0.94);
  });
});
