import { createRequire } from 'node:module';
import { T_CRITICAL_TWO_SIDED } from './t-critical-table.ts';
import { loadBundled } from './bundled-package.ts';

// A t quantile is an inverse incomplete beta function: slow next to a fit, and asked for with the same
// few degrees of freedom over and over. The common ones are in a table; any other is computed once and
// kept, its package (many small modules, about a tenth of a second to load) loaded then.
const computed = new Map<string, number>();
let quantile: ((p: number, dof: number) => number) | undefined;

/** The two-sided critical value of Student's t at level `p`: t(1 - p/2, dof). */
export function tCriticalTwoSided(p: number, dof: number): number {
  const table = T_CRITICAL_TWO_SIDED.get(p);
  if (table && Number.isInteger(dof) && dof >= 1 && dof <= table.length) return table[dof - 1];
  const key = `${p} ${dof}`;
  let t = computed.get(key);
  if (t === undefined) {
    quantile ??= createRequire(import.meta.url)('@stdlib/stats-base-dists-t-quantile') as (p: number, dof: number) => number;
    t = quantile(1 - p / 2, dof);
    computed.set(key, t);
  }
  return t;
}

/** The two-sided 95 % Student t critical value t(0.975, dof). */
export function tCritical95(dof: number): number {
  return tCriticalTwoSided(0.05, dof);
}

let cdf: ((t: number, dof: number) => number) | undefined;

/** P(|T| >= |t|) for Student's t with `dof` degrees of freedom. */
export function tTwoSidedP(t: number, dof: number): number {
  // Loaded on the first end-value signal that passes its screen: about 9 % of `check --jsonl`'s time in
  // two workers when each loaded the package's modules.
  cdf ??= loadBundled<(t: number, dof: number) => number>('student-t-cdf', '@stdlib/stats-base-dists-t-cdf');
  return 2 * cdf(-Math.abs(t), dof);
}
