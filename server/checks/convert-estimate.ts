import type { Estimate } from '../engine/estimate.ts';
import { convert } from '../engine/units.ts';

/** An estimate in another unit of the same kind: value, SE and interval scale alike. */
export function convertEstimate(estimate: Estimate, unit: string): Estimate {
  const f = convert(1, estimate.unit, unit);
  return {
    value: estimate.value * f,
    standardError: estimate.standardError * f,
    ci95: [estimate.ci95[0] * f, estimate.ci95[1] * f],
    unit,
  };
}
