import { EngineError } from '../../server/engine/engine-error.ts';
import { fitLinearLaw, type LawOrder, type RunSeries } from './integrated-laws.ts';
import { kUnitOf } from './order-analysis.ts';

/**
 * k as many students find it with several runs: each run's own line of the linear form, the ks
 * averaged, with the standard error of their mean; undefined with fewer than two runs that fit.
 */
export function meanOfRunLines(order: LawOrder, runs: readonly RunSeries[], time: string): { value: number; standardError: number } | undefined {
  if (runs.length < 2) return undefined;
  const ks = runs.flatMap((run) => {
    try {
      return [fitLinearLaw(order, [run], kUnitOf(order, time)).k.value];
    } catch (error) {
      if (error instanceof EngineError) return [];
      throw error;
    }
  });
  if (ks.length < 2) return undefined;
  const mean = ks.reduce((a, b) => a + b, 0) / ks.length;
  const sd = Math.sqrt(ks.reduce((a, b) => a + (b - mean) ** 2, 0) / (ks.length - 1));
  return { value: mean, standardError: sd / Math.sqrt(ks.length) };
}
