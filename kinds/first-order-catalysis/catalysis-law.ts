import { EngineError } from '../../server/engine/engine-error.ts';
import type { Estimate } from '../../server/engine/estimate.ts';
import { fitLine, type LineFit } from '../../server/engine/linear-fit.ts';
import { rateUnitOf, secondOrderRateUnitOf } from '../../server/engine/units.ts';

/**
 * The second stage: observed rate constants against catalyst concentration,
 * k_obs = k_N + k_A [catalyst], intercept k_N (uncatalysed) and slope k_A (catalytic constant).
 */
export interface CatalysisPoint {
  /** Catalyst concentration, in `units.concentration`. */
  concentration: number;
  /** k_obs, per `units.time`. */
  k: number;
  /** Standard error of k_obs; needed for the weighted fit. */
  standardError?: number;
}

export interface CatalysisOptions {
  units: { concentration: string; time: string };
  /** Weights 1/SE^2 from each k_obs's standard error. */
  weighted?: boolean;
}

export interface CatalysisFit {
  /** For a weighted fit, standard errors with each SE of k_obs taken as absolute. */
  kN: Estimate;
  kA: Estimate;
  weighted: boolean;
  line: LineFit;
  /**
   * A weighted fit's other convention: the SEs of k_obs known only up to a common factor, so the
   * covariance is scaled by the reduced chi-square. Both are in use; they differ by sqrt(chi2_red).
   */
  scaled?: { kN: Estimate; kA: Estimate; reducedChiSquared: number };
}

function estimates(line: LineFit, units: CatalysisOptions['units']): { kN: Estimate; kA: Estimate } {
  return {
    kN: { value: line.intercept, standardError: line.seIntercept, ci95: line.ci95.intercept, unit: rateUnitOf(units.time) },
    kA: { value: line.slope, standardError: line.seSlope, ci95: line.ci95.slope, unit: secondOrderRateUnitOf(units.concentration, units.time) },
  };
}

export function fitCatalysisLaw(points: CatalysisPoint[], options: CatalysisOptions): CatalysisFit {
  const weighted = options.weighted === true;
  let sigma: number[] | undefined;
  if (weighted) {
    sigma = points.map((p, i) => {
      if (p.standardError === undefined) {
        throw new EngineError('bad-weight', `point ${i} has no standard error for a weighted fit`, `points[${i}].standardError`);
      }
      return p.standardError;
    });
  }
  const x = points.map((p) => p.concentration);
  const y = points.map((p) => p.k);
  const line = fitLine(x, y, { sigma });
  const scaledLine = sigma && fitLine(x, y, { sigma, scaleByResidual: true });
  return {
    ...estimates(line, options.units),
    weighted,
    line,
    scaled: scaledLine && { ...estimates(scaledLine, options.units), reducedChiSquared: scaledLine.reducedChiSquared },
  };
}
