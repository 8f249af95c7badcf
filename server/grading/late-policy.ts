import type { LatePolicy } from '../../schemas/common.ts';
import { HANDING_IN_STAGE, type CheckResult, type Finding } from '../../schemas/result.ts';
import { OFF_THE_SCORE, settleBooks } from '../checks/rubric-books.ts';

type Result = Pick<CheckResult, 'status' | 'score' | 'maxScore' | 'items' | 'findings'>;

/** The one finding of a late submission under 'deduct'; its id is stable, so a TA's override of it carries over to a regrade. */
export function lateFinding(points: number): Finding {
  return {
    id: 'late-submission@submission',
    code: 'late-submission',
    stage: HANDING_IN_STAGE.id,
    path: 'submission',
    severity: 'error',
    pointsLost: points,
    rubricItem: OFF_THE_SCORE,
    message: `Submitted after the deadline: the assignment takes ${points === 1 ? '1 point' : `${points} points`} off late work.`,
  };
}

/**
 * A checked result as the assignment's late policy leaves it. Under 'deduct' a late submission gets
 * one finding costing the policy's points, off the score (never below 0; the maximum stays); 'grade'
 * and 'hold' change nothing here (holding is the release's business), nor does a rejected result.
 * Pure: the result in, a new result out.
 */
export function applyLatePolicy<R extends Result>(result: R, late: LatePolicy, isLate: boolean): R {
  if (!isLate || late.policy !== 'deduct' || result.status !== 'checked' || result.score === null) return result;
  // Applied afresh: a late finding already there (a result adjusted before) is replaced, never doubled.
  const findings = result.findings.filter((f) => f.code !== 'late-submission');
  const books = settleBooks(result.items, result.maxScore, [...findings, lateFinding(late.points)]);
  return { ...result, findings: books.findings, score: books.score, maxScore: books.maxScore };
}
