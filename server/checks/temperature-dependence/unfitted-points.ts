import type { Submission } from '../../../schemas/kinds/temperature-dependence.ts';
import { EngineError } from '../../engine/engine-error.ts';
import type { TemperaturePoint } from '../../engine/temperature-dependence.ts';
import { convert } from '../../engine/units.ts';
import type { TemperatureAnalysis } from './refit.ts';

/**
 * The k a student reports for each run we could not fit, per second at its temperature: their E_a
 * and the rest include it, so values that follow from their own k are carried forward, not charged.
 * A k whose unit cannot be read is left out.
 */
export function theirUnfittedPoints(submission: Submission, analysis: Pick<TemperatureAnalysis, 'unfitted'>): TemperaturePoint[] {
  return analysis.unfitted.flatMap(({ index, temperature }) => {
    const k = submission.points[index].run?.reported?.k;
    if (!k) return [];
    try {
      const se = k.uncertainty === undefined ? undefined : Math.abs(convert(Number(k.uncertainty), k.unit, 's^-1'));
      return [{ temperature, k: convert(Number(k.value), k.unit, 's^-1'), standardError: se }];
    } catch (error) {
      if (error instanceof EngineError) return [];
      throw error;
    }
  });
}
