import type { RubricCount } from '../../../schemas/result.ts';
import type { Settings, Submission } from '../schemas.ts';

/**
 * What each rubric item is worth for this submission: the half-life once per run, the rest once; the
 * order is left out where the data cannot tell the orders apart (nothing to grade it against), and an
 * item worth nothing is left out.
 */
export function rubricCounts(settings: Settings, submission: Pick<Submission, 'runs'>, orderGradable = true): RubricCount[] {
  return Object.entries(settings.rubric).flatMap(([item, each]) => {
    const count = item === 'halfLife' ? submission.runs.length : item === 'order' && !orderGradable ? 0 : 1;
    return each > 0 && count > 0 ? [{ item, count, each }] : [];
  });
}
