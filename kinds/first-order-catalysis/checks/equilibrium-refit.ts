import type { Equilibrium, EquilibriumRefit, RunEquilibrium, Settings } from '../schemas.ts';
import { convertEstimate } from '../../../server/checks/convert-estimate.ts';
import { compositionOf, fractionFromConstant, inDm, inGramsPerMl, meanConstant, splitRate } from '../equilibrium.ts';
import type { RateLawRefit } from './check-rate-law.ts';
import { isFitted, type RunAnalysis, type RunOutcome } from './run-analysis.ts';

/** The mass concentration of a run: its own where the block names it, else the block's. */
export const concentrationOf = (block: Equilibrium, label: string): number => inGramsPerMl(block.concentrationByRun?.[label] ?? block.concentration);

export const pureFormsOf = (block: Equilibrium) => ({ a: block.pureForms.A.value, b: block.pureForms.B.value });

/**
 * The standard error of α_inf, one reading: the larger of the display's rounding (a uniform error of
 * one display step has SD step/√12) and the scatter of one reading, as stated for the instrument or as
 * the run's own readings show it about their exponential fit.
 */
export function endValueSE(a: RunAnalysis, settings: Settings): number {
  return Math.max(settings.displayStep / Math.sqrt(12), settings.instrumentNoise ?? 0, a.ownEndValue?.residualSD ?? 0);
}

/** One run's composition and split of k, or null without x_inf. */
function runEquilibrium(a: RunOutcome, block: Equilibrium, settings: Settings): RunEquilibrium | null {
  if (!isFitted(a) || a.infinity === undefined) return null;
  const composition = compositionOf(a.infinity, endValueSE(a, settings), inDm(block.pathLength), concentrationOf(block, a.label), pureFormsOf(block));
  const run: RunEquilibrium = { label: a.label, ...composition };
  // No K, no split; nor without a k_obs of ours to split.
  if (composition.K && !a.undetermined) Object.assign(run, splitRate(convertEstimate(a.expected, settings.units.k), composition.xB));
  return run;
}

/** Our composition per run, the mean K and its spread, and k_N and k_A split with the mean composition. */
export function refitEquilibrium(block: Equilibrium, analyses: RunOutcome[], rateLaw: RateLawRefit | undefined, settings: Settings): EquilibriumRefit {
  const runs = analyses.map((a) => runEquilibrium(a, block, settings));
  const meanK = meanConstant(runs.flatMap((r) => (r?.K ? [r.K] : [])));
  const refit: EquilibriumRefit = { runs, meanK };
  if (meanK && rateLaw) {
    const x = fractionFromConstant(meanK);
    const n = splitRate(rateLaw.kN, x);
    const c = splitRate(rateLaw.kA, x);
    Object.assign(refit, { kNf: n.kf, kNr: n.kr, kAf: c.kf, kAr: c.kr });
  }
  return refit;
}
