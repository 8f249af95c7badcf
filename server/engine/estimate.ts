import type { LineFit } from './linear-fit.ts';

/** A fitted quantity with its standard error, 95 % confidence interval and unit. */
export interface Estimate {
  value: number;
  standardError: number;
  ci95: [number, number];
  unit: string;
}

/** The negated slope of a line as an estimate: a decay's rate constant from ln F (or ln x) against t. */
export function negatedSlope(line: LineFit, unit: string): Estimate {
  return {
    value: -line.slope,
    standardError: line.seSlope,
    ci95: [-line.ci95.slope[1], -line.ci95.slope[0]],
    unit,
  };
}

/**
 * The half-life ln 2 / k of a first-order rate constant: standard error by first-order error
 * propagation, interval by mapping the rate constant's interval (exact for a monotonic function).
 */
export function halfLifeOf(k: Estimate, timeUnit: string): Estimate {
  const value = Math.LN2 / k.value;
  return {
    value,
    standardError: (Math.LN2 * k.standardError) / (k.value * k.value),
    // A rate interval reaching zero leaves the half-life unbounded above.
    ci95: [Math.LN2 / k.ci95[1], k.ci95[0] > 0 ? Math.LN2 / k.ci95[0] : Infinity],
    unit: timeUnit,
  };
}
