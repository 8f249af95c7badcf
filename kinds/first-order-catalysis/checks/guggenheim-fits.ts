import { EngineError } from '../../../server/engine/engine-error.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { fitGuggenheim } from '../../../server/engine/guggenheim.ts';
import type { RunAnalysis } from './run-analysis.ts';

/**
 * The Guggenheim fits a student may have made of a run without x_inf: one for each interval D from
 * the first reading to another that leaves at least the pairs a line needs. The method is accepted
 * for k (see run-analysis and the run's 95 % interval) at whatever D the student chose, so the SE of
 * the slope of ln|x_t - x_(t+D)| on t at that D is theirs to report too.
 */
export function guggenheimFits(a: RunAnalysis): Estimate[] {
  if (a.infinity !== undefined) return [];
  const run = { times: a.times, readings: a.readings, timeUnit: a.timeUnit.text };
  const fits: Estimate[] = [];
  for (let j = 1; j < a.times.length; j++) {
    try {
      fits.push(fitGuggenheim(run, a.times[j] - a.times[0]).k);
    } catch (error) {
      // Too few pairs at this D, or a pair that does not change the run's way: no fit at this D.
      if (!(error instanceof EngineError)) throw error;
    }
  }
  return fits;
}
