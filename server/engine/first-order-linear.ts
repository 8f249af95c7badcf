import { halfLifeOf, negatedSlope, type Estimate } from './estimate.ts';
import { fitLineModel, type LineFit, type LineModel } from './linear-fit.ts';
import { firstOrderTransform, type FirstOrderRun, type FirstOrderTransform } from './first-order-run.ts';
import { rateUnitOf } from './units.ts';

/** The linearised first-order fit: ln F against t, through the origin or with an intercept. */
export interface FirstOrderLinearFit {
  model: LineModel;
  /** k_obs = -slope, positive for a decay toward x_inf, per the run's time unit. */
  k: Estimate;
  halfLife: Estimate;
  /** The fitted ln F at t = 0: zero by construction through the origin. */
  interceptLnF: { value: number; standardError: number };
  line: LineFit;
  transform: FirstOrderTransform;
}

export function fitFirstOrderLinear(run: FirstOrderRun & { infinity: number }, model: LineModel): FirstOrderLinearFit {
  const transform = firstOrderTransform(run, run.infinity);
  return fitTransformed(transform, run.timeUnit, model);
}

/** The fit of an already transformed run, so one transform serves both models. */
export function fitTransformed(transform: FirstOrderTransform, timeUnit: string, model: LineModel): FirstOrderLinearFit {
  const line = fitLineModel(model, transform.t, transform.lnF);
  const k = negatedSlope(line, rateUnitOf(timeUnit));
  return {
    model,
    k,
    halfLife: halfLifeOf(k, timeUnit),
    interceptLnF: { value: line.intercept, standardError: line.seIntercept },
    line,
    transform,
  };
}
