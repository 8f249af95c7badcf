import { gaussian } from './seeded-random.ts';

/** Readings x(t) = x_inf + (x_0 - x_inf) e^(-k t), optionally with noise and rounded to a resolution. */
export interface SyntheticRunSpec {
  k: number;
  x0: number;
  xInf: number;
  times: number[];
  /** Standard deviation of Gaussian noise added to each reading. */
  noise?: number;
  /** Round each reading to this step (0.001 deg: the display of a laboratory polarimeter). */
  resolution?: number;
  random?: () => number;
}

export function syntheticReadings(spec: SyntheticRunSpec): number[] {
  const { k, x0, xInf, times, noise = 0, resolution, random } = spec;
  return times.map((t) => {
    let x = xInf + (x0 - xInf) * Math.exp(-k * t);
    if (noise > 0 && random) x += noise * gaussian(random);
    if (resolution) x = Math.round(x / resolution) * resolution;
    return x;
  });
}

export const minutes = (count: number): number[] => Array.from({ length: count }, (_, i) => i);
