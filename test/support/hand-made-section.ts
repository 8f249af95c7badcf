import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { fitFirstOrderLinear } from '../../server/engine/first-order-linear.ts';
import { fitLine } from '../../server/engine/linear-fit.ts';
import { reportedValue, toFigures } from '../../server/demo/careful-rounding.ts';

/**
 * A hand-made case, invented (not measurements): four runs at [H+] = 0.05, 0.10, 0.20, 0.40 M made
 * exactly by k_obs = 0.02 + 0.2 [H+] per minute, so k_obs = 0.03, 0.04, 0.06, 0.10 min^-1,
 * k_N = 0.02 min^-1 and k_A = 0.2 M^-1 min^-1. Readings x = 2 + 10 e^(-k t) deg at t = 0..10 min,
 * rounded to 0.001 deg; x_inf = 2.000 deg. Rounding moves each refit k by less than 1e-4 relative.
 * The student's report is what a careful student computes from these readings.
 */
export const acid = [0.05, 0.1, 0.2, 0.4];
export const trueK = acid.map((c) => 0.02 + 0.2 * c);
const times = Array.from({ length: 11 }, (_, i) => i);


export function readingsFor(k: number): Array<[number, number]> {
  return times.map((t) => [t, Math.round((2 + 10 * Math.exp(-k * t)) * 1000) / 1000]);
}

/** The report of a careful student; `k` may be replaced to model a slip, then k_N and k_A follow from it. */
export function handMadeSubmission(): Submission {
  const runs = acid.map((c, i) => {
    const readings = readingsFor(trueK[i]);
    const fit = fitFirstOrderLinear({ times, readings: readings.map((r) => r[1]), infinity: 2, timeUnit: 'min' }, 'origin');
    return {
      label: `${c} M`,
      catalyst: { value: c, unit: 'M' },
      timeUnit: 'min',
      readings,
      infinity: 2,
      reported: {
        lnF: fit.transform.lnF.map((v) => toFigures(v, 5)),
        k: reportedValue(fit.k.value, fit.k.standardError, 'min^-1'),
      },
    };
  });
  const submission: Submission = { studentId: 'H-01', runs, reported: {} };
  return recomputeRateLaw(submission);
}

/** k_N and k_A by an ordinary straight-line fit of the reported k values, as a student would. */
export function recomputeRateLaw(submission: Submission): Submission {
  const ks = submission.runs.map((r) => Number(r.reported!.k!.value));
  const line = fitLine(acid, ks);
  submission.reported = {
    kN: reportedValue(line.intercept, line.seIntercept, 'min^-1'),
    kA: reportedValue(line.slope, line.seSlope, 'M^-1 min^-1'),
  };
  return submission;
}
