import type { Submission } from '../schemas.ts';
import type { TemperaturePoint } from '../activation-fits.ts';
import { readableIn } from '../../../server/checks/reported-number.ts';
import type { TemperatureAnalysis } from './refit.ts';

/**
 * The k a student reports for each run we could not fit, per second at its temperature: their E_a
 * and the rest include it, so values that follow from their own k are carried forward, not charged.
 * A k whose unit cannot be read is left out.
 */
export function theirUnfittedPoints(submission: Submission, analysis: Pick<TemperatureAnalysis, 'unfitted'>): TemperaturePoint[] {
  return analysis.unfitted.flatMap(({ index, temperature }) => {
    const reported = submission.points[index].run?.reported?.k;
    const k = reported && readableIn(reported, 's^-1');
    return k ? [{ temperature, k: k.value, standardError: k.uncertainty }] : [];
  });
}
