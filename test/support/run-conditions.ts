import { gaussian } from '../../server/demo/seeded-random.ts';

/**
 * One invented run drawn from the generator's ranges (k_obs 0.0175 to 0.13 min^-1, x_0 20 to 25 deg,
 * x_inf 8 to 11 deg, noise 0.002 to 0.004 deg, a reading a minute for 15 minutes, all shown to 0.001
 * deg), honest or with one condition of how it was measured:
 * - `early-end`: the end value read while 2 to 10 % of the change was still to come;
 * - `linear-drift`: an instrument drifting steadily by `size` deg over the run, either way;
 * - `warm-up`: an instrument still settling, by `size` deg with a time constant of 1.5 to 4 min.
 */
export type RunCondition = 'honest' | 'early-end' | 'linear-drift' | 'warm-up';

export function conditionRun(random: () => number, condition: RunCondition, size = 0) {
  const uniform = (low: number, high: number) => low + (high - low) * random();
  const k = uniform(0.0175, 0.13);
  const x0 = uniform(20, 25);
  const xInf = uniform(8, 11);
  const noise = uniform(0.002, 0.004);
  const sign = random() < 0.5 ? -1 : 1;
  const tau = uniform(1.5, 4);
  const remaining = condition === 'early-end' ? uniform(0.02, 0.1) : 0;
  const drift = (t: number) => (condition === 'linear-drift' ? (sign * size * t) / 15 : condition === 'warm-up' ? -sign * size * Math.exp(-t / tau) : 0);
  const shown = (x: number) => Number(x.toFixed(3));
  const times = Array.from({ length: 16 }, (_, t) => t);
  return {
    label: 'A',
    catalyst: { value: 0.1, unit: 'M' },
    timeUnit: 'min',
    readings: times.map((t) => [t, shown(xInf + (x0 - xInf) * Math.exp(-k * t) + drift(t) + noise * gaussian(random))]),
    infinity: shown(xInf + (x0 - xInf) * remaining + noise * gaussian(random)),
  };
}
