import type { Finding } from '../../../schemas/result.ts';
import type { KindResult } from '../../../reports/feedback-input.ts';
import type { Refit, Submission } from '../../../kinds/reaction-order/schemas.ts';
import { fadingResult, fadingSubmission } from './report-fixture.ts';

/**
 * Hand-made students on the fading readings: what each reported and the findings a checker would give
 * (written by hand, in the checker's words as far as known; the report draws whatever it is handed).
 * k of order 2 from the 1/[A] line is 6155 M^-1 min^-1 (report-fixture.ts); with it, t_1/2 = 1/(k [A]_0)
 * is 1/(6155 × 2.975e-5) = 5.46 min for run A and 1/(6155 × 1.4917e-5) = 10.9 min for run B, by hand.
 */
export interface Sample {
  submission: Submission;
  result: KindResult<Refit>;
}

const finding = (code: string, path: string, stage: string, pointsLost: number, message: string, extra: Partial<Finding> = {}): Finding => ({
  id: `${code}@${path}`,
  code,
  stage,
  path,
  severity: pointsLost > 0 ? 'error' : 'info',
  pointsLost,
  message,
  ...extra,
});

/**
 * The runs with half-lives by order 2, from its fit to [A] (k = 2918.476244 ± 259.433058 M^-1 min^-1,
 * 95 % CI 2375.476613 to 3461.475875): t_1/2 = 1/(k [A]_0) = 11.35838311 min for run A ([A]_0
 * 3.016666667e-5 M) and 22.65418559 min for run B (1.5125e-5 M), SE t_1/2 × 259.43/2918.48, by hand.
 */
function secondOrderRuns(): Refit['runs'] {
  const [a, b] = fadingResult('R-02', []).refit!.runs;
  return [
    { ...a, halfLife: { value: 11.35838311, standardError: 1.009684444, ci95: [9.576600405, 13.95474537], unit: 'min' } },
    { ...b, halfLife: { value: 22.65418559, standardError: 2.013805888, ci95: [19.10043717, 27.83260509], unit: 'min' } },
  ];
}

export function sampleStudents(): Sample[] {
  const clean = fadingSubmission('R-01', { order: 1, k: { value: '0.0454', uncertainty: '0.0006', unit: 'min^-1' }, halfLives: [{ value: '15.3', unit: 'min' }, { value: '15.3', unit: 'min' }] });
  const secondOrder = fadingSubmission('R-02', { order: 2, k: { value: '6.2e3', uncertainty: '0.5e3', unit: 'M^-1 min^-1' }, halfLives: [{ value: '5.46', unit: 'min' }, { value: '10.9', unit: 'min' }] });
  const unit = fadingSubmission('R-03', { order: 1, k: { value: '0.0454', uncertainty: '0.0006', unit: 'M^-1 min^-1' }, halfLives: [{ value: '15.3', unit: 'min' }, undefined] });
  const seconds = fadingSubmission('R-04', { order: 1, k: { value: '0.0454', uncertainty: '0.0006', unit: 's^-1' }, halfLives: [{ value: '15.3', unit: 'min' }, { value: '15.3', unit: 'min' }] });
  return [
    { submission: clean, result: fadingResult('R-01', []) },
    {
      submission: secondOrder,
      result: {
        ...fadingResult('R-02', [
          finding('order-not-supported', 'reported.order', 'order', 2, 'You report order 2, but the data support order 1: the order-1 law alone leaves residuals without a pattern. The order-2 law leaves residuals that run in a pattern (Durbin-Watson p = 4.2e-5), the mark of a curve the law does not follow. Please compare the three plots ([A], ln [A] and 1/[A] against t) and see which is straight over the whole run.', { reported: 2, expected: 1 }),
          finding('carried-forward', 'reported.k', 'order', 0, 'k = 6.2e3 M^-1 min^-1 follows from the order 2 you report; it is not charged again.'),
        ]),
        // k and half-lives are graded by the order reported; the data clearly favour order 1.
        refit: { ...fadingResult('R-02', []).refit!, gradedOrder: 2, orderVerdict: 'not-supported', runs: secondOrderRuns() },
      },
    },
    {
      submission: unit,
      result: fadingResult('R-03', [
        finding('k-unit-order', 'reported.k.unit', 'order', 1, 'The unit of k, M^-1 min^-1, is the unit of a rate constant of order 2, but you report order 1, whose k is in min^-1 (M^(1−n) per time unit, from −d[A]/dt = k[A]^n). The value is read as min^-1. Please check the unit against the order.'),
        finding('missing-value', 'runs[1].reported.halfLife', 'half-life', 1, 'The half-life of run “B” is missing.'),
      ]),
    },
    {
      submission: seconds,
      result: fadingResult('R-04', [finding('time-unit', 'reported.k', 'order', 2, 'k = 0.0454 s^-1 is 60 times the refit 0.04539 min^-1 read in s^-1: the time unit of the value does not match the unit declared.')]),
    },
  ];
}
