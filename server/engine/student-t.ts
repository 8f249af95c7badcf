import { createRequire } from 'node:module';

// The t quantile is an inverse incomplete beta function: slow next to a fit, and asked for with the
// same few degrees of freedom over and over, so keep each one. Its package (many small modules, about
// a tenth of a second to load) is loaded on the first fit, not when a command starts.
const twoSided95 = new Map<number, number>();
let quantile: ((p: number, dof: number) => number) | undefined;

/** The two-sided 95 % Student t critical value t(0.975, dof). */
export function tCritical95(dof: number): number {
  let t = twoSided95.get(dof);
  if (t === undefined) {
    quantile ??= createRequire(import.meta.url)('@stdlib/stats-base-dists-t-quantile') as (p: number, dof: number) => number;
    t = quantile(0.975, dof);
    twoSided95.set(dof, t);
  }
  return t;
}

let cdf: ((t: number, dof: number) => number) | undefined;

/** P(|T| >= |t|) for Student's t with `dof` degrees of freedom. */
export function tTwoSidedP(t: number, dof: number): number {
  cdf ??= createRequire(import.meta.url)('@stdlib/stats-base-dists-t-cdf') as (t: number, dof: number) => number;
  return 2 * cdf(-Math.abs(t), dof);
}
