import type { LawOrder } from '../integrated-laws.ts';
import type { OrderAnalysis } from '../order-analysis.ts';
import { meanOfRunLines } from '../run-lines.ts';

/** k and its standard error by every accepted method for one law: the fit to [A], its linear form, and the mean of each run's own line. */
export interface AcceptedK {
  values: number[];
  standardErrors: number[];
  /** What each value is, in words, for a message. */
  bases: string[];
}

export function acceptedK(analysis: OrderAnalysis, order: LawOrder): AcceptedK {
  const fit = analysis.fits[order];
  const out: AcceptedK = { values: [], standardErrors: [], bases: [] };
  const add = (k: { value: number; standardError: number } | undefined, basis: string) => {
    if (!k) return;
    out.values.push(k.value);
    out.standardErrors.push(k.standardError);
    out.bases.push(basis);
  };
  add(fit.nonlinear?.k, 'the refit');
  add(fit.linear?.k, 'the refit by the linear form');
  add(meanOfRunLines(order, analysis.runs.map((run) => run.series), analysis.time), 'the mean of each run’s own line');
  return out;
}
