import { EngineError } from './engine-error.ts';
import type { Estimate } from './estimate.ts';
import { fitLine, type LineFit } from './linear-fit.ts';
import { rateUnitOf, secondOrderRateUnitOf } from './units.ts';

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
  /** Weights 1/SE^2 from each k_obs's standard error, taken as absolute. */
  weighted?: boolean;
}

export interface CatalysisFit {
  kN: Estimate;
  kA: Estimate;
  weighted: boolean;
  line: LineFit;
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
  const line = fitLine(
    points.map((p) => p.concentration),
    points.map((p) => p.k),
    { sigma },
  );
  const { concentration, time } = options.units;
  return {
    kN: { value: line.intercept, standardError: line.seIntercept, ci95: line.ci95.intercept, unit: rateUnitOf(time) },
    kA: {
      value: line.slope,
      standardError: line.seSlope,
      ci95: line.ci95.slope,
      unit: secondOrderRateUnitOf(concentration, time),
    },
    weighted,
    line,
  };
}
