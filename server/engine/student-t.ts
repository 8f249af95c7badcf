import tQuantile from '@stdlib/stats-base-dists-t-quantile';

// The t quantile is an inverse incomplete beta function: slow next to a fit, and asked for with the
// same few degrees of freedom over and over, so keep each one.
const twoSided95 = new Map<number, number>();

/** The two-sided 95 % Student t critical value t(0.975, dof). */
export function tCritical95(dof: number): number {
  let t = twoSided95.get(dof);
  if (t === undefined) {
    t = tQuantile(0.975, dof);
    twoSided95.set(dof, t);
  }
  return t;
}
