import { loadBundled } from '../../server/engine/bundled-package.ts';

let betaCdf: ((x: number, a: number, b: number) => number) | undefined;

/**
 * P(F >= ratio) for an F distribution with (dof, dof) degrees of freedom: how often two fits as good
 * as each other would leave residual sums this far apart. Through the regularized incomplete beta
 * function, P(F <= f; d1, d2) = I_{d1 f / (d1 f + d2)}(d1/2, d2/2) (a standard identity, from memory).
 * The laws are not nested, so this is a yardstick, not an exact test (common practice, no source).
 */
export function varianceRatioP(ratio: number, dof: number): number {
  if (!(ratio > 0) || !(dof > 0)) return 1;
  if (!Number.isFinite(ratio)) return 0;
  betaCdf ??= loadBundled<(x: number, a: number, b: number) => number>('beta-cdf', '@stdlib/stats-base-dists-beta-cdf');
  return 1 - betaCdf(ratio / (ratio + 1), dof / 2, dof / 2);
}
