import type { Submission } from '../schemas.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { fmt } from '../../../server/checks/format.ts';

const LABELS = { Ea: 'E_a', A: 'A', dH: 'ΔH‡', dS: 'ΔS‡' } as const;

/** Two temperatures (points fitted) give an exact line: its values are graded, its standard errors are not defined. */
export function hasTwoPoints(fittedPoints: number): boolean {
  return fittedPoints === 2;
}

/**
 * The note (no points) that with two temperatures the standard errors are not defined, naming any the
 * student gave: a line through two points leaves no scatter to estimate them from (common practice,
 * no source: the residual degrees of freedom are n - 2 = 0).
 */
export function twoPointsNote(submission: Submission): DraftFinding {
  const given = (Object.keys(LABELS) as Array<keyof typeof LABELS>).flatMap((q) => {
    const u = submission.reported?.[q]?.uncertainty;
    return u === undefined ? [] : [`${LABELS[q]} (± ${typeof u === 'number' ? fmt(u) : u})`];
  });
  const theirs = given.length === 0 ? '' : ` The standard error you give for ${given.join(', ')} is not defined with two points either; no points are taken for it.`;
  return {
    code: 'uncertainty-undefined',
    path: 'points',
    stage: 'arrhenius',
    severity: 'info',
    charge: 0,
    message:
      'Only two temperatures: the straight line passes through both exactly, so E_a, A, ΔH‡ and ΔS‡ are graded as usual, ' +
      'but their standard errors are not defined with two points (no scatter is left to estimate them from). ' +
      `The standard error of E_a is not graded and is left out of the maximum.${theirs} A third temperature would give them.`,
  };
}
