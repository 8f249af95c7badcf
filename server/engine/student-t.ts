import { createRequire } from 'node:module';
import { T_CRITICAL_TWO_SIDED } from './t-critical-table.ts';

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

/**
 * The distribution function's package, from the one file `npm run build` bundles it into where there
 * is one (dist/server/vendor/): the same code, loaded in about 30 ms where its 200-odd small modules
 * took 300-500 ms, in every process and worker that checks a run past the end-value screen (about
 * 9 % of the CPU time of `check --jsonl` on 5,000 submissions in two workers). Run from the sources,
 * the package itself.
 */
function loadCdf(): (t: number, dof: number) => number {
  const require = createRequire(import.meta.url);
  try {
    return require('../vendor/student-t-cdf.cjs') as (t: number, dof: number) => number;
  } catch (error) {
    if ((error as { code?: string }).code !== 'MODULE_NOT_FOUND') throw error;
    return require('@stdlib/stats-base-dists-t-cdf') as (t: number, dof: number) => number;
  }
}

/** P(|T| >= |t|) for Student's t with `dof` degrees of freedom. */
export function tTwoSidedP(t: number, dof: number): number {
  cdf ??= loadCdf();
  return 2 * cdf(-Math.abs(t), dof);
}
