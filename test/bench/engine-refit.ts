import { fitCatalysisLaw } from '../../kinds/first-order-catalysis/catalysis-law.ts';
import { fitTransformed } from '../../server/engine/first-order-linear.ts';
import { fitFirstOrderNonlinear } from '../../server/engine/first-order-nonlinear.ts';
import { firstOrderTransform } from '../../server/engine/first-order-run.ts';
import { minutes, syntheticReadings } from '../../server/demo/synthetic-run.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';

/**
 * Engine throughput: full refits per second of a standard submission (4 runs x 16 readings plus
 * x_inf; per run ln F through the origin and with an intercept and the exponential fit with x_inf
 * fitted; then k_obs against [H+], ordinary and weighted), on one core.
 */
const acid = [0.05, 0.1, 0.2, 0.4];

function makeSubmissions(count: number) {
  const random = seededRandom(42);
  const times = minutes(16);
  return Array.from({ length: count }, () =>
    acid.map((c) => {
      const k = 0.0221 + 0.594 * c;
      const readings = syntheticReadings({ k, x0: 22.44, xInf: 10.54, times, noise: 0.003, resolution: 0.001, random });
      return { times, readings, infinity: 10.54, timeUnit: 'min', concentration: c };
    }),
  );
}

function refit(runs: ReturnType<typeof makeSubmissions>[number]): number {
  const points = runs.map((run) => {
    const transform = firstOrderTransform(run, run.infinity);
    const origin = fitTransformed(transform, run.timeUnit, 'origin');
    const intercept = fitTransformed(transform, run.timeUnit, 'intercept');
    fitFirstOrderNonlinear(run, { infinity: 'fitted', initialK: intercept.k.value });
    return { concentration: run.concentration, k: origin.k.value, standardError: origin.k.standardError };
  });
  const units = { concentration: 'M', time: 'min' };
  fitCatalysisLaw(points, { units, weighted: true });
  return fitCatalysisLaw(points, { units }).kA.value;
}

export function benchEngineRefit(): { refitsPerSecond: number; microsecondsPerRefit: number } {
  const submissions = makeSubmissions(1000);
  let sink = 0;
  for (let i = 0; i < 3000; i++) sink += refit(submissions[i % submissions.length]);
  const start = process.hrtime.bigint();
  let count = 0;
  while (process.hrtime.bigint() - start < 3_000_000_000n) {
    for (let i = 0; i < 1000; i++) sink += refit(submissions[(count + i) % submissions.length]);
    count += 1000;
  }
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  if (!Number.isFinite(sink)) throw new Error('a refit returned a non-finite k_A');
  return { refitsPerSecond: count / seconds, microsecondsPerRefit: (seconds / count) * 1e6 };
}
