import type { EquilibriumRefit } from '../schemas.ts';
import type { Signal } from '../../../schemas/result.ts';
import { fmt } from '../../../server/checks/format.ts';

/**
 * `constant-apart`: the catalyst speeds both directions alike, so K is the same in every run. A run
 * whose K differs from the mean of the others by more than their standard errors allow (|z| above the
 * two-sided normal quantile for p = K_APART_P) and by more than K_APART_SHARE of it (a difference that
 * matters) is a prompt for review, never points: an end value read before equilibrium, or a solution
 * made up at another concentration than assumed, would show so. Judged with three runs' K or more,
 * where "the others" can agree among themselves.
 */
export const K_APART_P = 1e-3;
// scipy 1.17.1: scipy.stats.norm.ppf(1 - 0.0005) = 3.2905267 (two-sided p = 1e-3).
export const K_APART_Z = 3.2905267;
export const K_APART_SHARE = 0.01;
const MIN_RUNS = 3;

interface RunK {
  i: number;
  label: string;
  K: { value: number; standardError: number };
}

/** A run's K against the mean of the others: how far, in SEs and as a share of that mean. */
function apart(run: RunK, runs: RunK[]) {
  const others = runs.filter((o) => o !== run);
  const mean = others.reduce((s, o) => s + o.K.value, 0) / others.length;
  // The others' mean with its SE from theirs, not from their scatter: one run apart would inflate that.
  const meanSE = Math.sqrt(others.reduce((s, o) => s + o.K.standardError ** 2, 0)) / others.length;
  return { run, mean, meanSE, z: (run.K.value - mean) / Math.hypot(run.K.standardError, meanSE), share: Math.abs(run.K.value - mean) / Math.abs(mean) };
}

/**
 * The run furthest from the others is judged first and, when apart, set aside before the next is
 * judged: a run apart pulls the others' mean towards itself, and would otherwise make them look apart too.
 */
export function constantApartSignals(refit: EquilibriumRefit): Signal[] {
  let runs: RunK[] = refit.runs.flatMap((r, i) => (r?.K ? [{ i, label: r.label, K: r.K }] : []));
  const out: Signal[] = [];
  while (runs.length >= MIN_RUNS) {
    const furthest = runs.map((run) => apart(run, runs)).reduce((a, b) => (Math.abs(b.z) > Math.abs(a.z) ? b : a));
    const { run, mean, meanSE, z, share } = furthest;
    if (!(Math.abs(z) > K_APART_Z && share > K_APART_SHARE)) break;
    out.push({
      code: 'constant-apart',
      path: `runs[${run.i}].infinity`,
      message: `K of run "${run.label}" is ${fmt(run.K.value)} ± ${fmt(run.K.standardError)}, the other runs' mean ${fmt(mean)} ± ${fmt(meanSE)}: ${fmt(100 * share)} % apart, ${fmt(Math.abs(z))} standard errors, where one in ${fmt(1 / K_APART_P)} would lie so far by chance. K should be the same in every run, since the catalyst speeds both directions alike. An end value read before equilibrium, or a solution made up at another concentration than the one assumed, could explain it. Worth a look, not a finding.`,
      evidence: { K: run.K.value, KStandardError: run.K.standardError, othersMean: mean, othersMeanSE: meanSE, z, share },
    });
    runs = runs.filter((r) => r !== run);
  }
  return out.sort((a, b) => a.path.localeCompare(b.path));
}
