import type { NumberLike, ReportedValue } from '../../schemas/common.ts';
import type { DraftFinding } from './draft-finding.ts';
import { readWritten } from './written-number.ts';

/**
 * Rounding of a value against its uncertainty: the uncertainty to 1 or 2 significant figures and the
 * value to the same decimal place (common practice, no source). A finding rests only on digits that
 * are there: the zeros a JSON number may have lost, and an integer's trailing zeros, are read the way
 * that raises no finding (see written-number.ts), so a one-figure uncertainty sent as a number, or
 * written 800, is allowed the second figure it may have had.
 */
export interface SigFigProblem {
  problem: 'uncertainty-digits' | 'value-over-precise' | 'value-under-precise';
  text: string;
}

export function sigFigProblem(value: NumberLike, uncertainty: NumberLike): SigFigProblem | undefined {
  if (Number(uncertainty) === 0) return undefined;
  const uText = String(uncertainty);
  const u = readWritten(uncertainty);
  if (u.figures > 2) {
    return { problem: 'uncertainty-digits', text: `the uncertainty ${uText} has ${u.figures} significant figures; 1 or 2 are meaningful` };
  }
  const v = readWritten(value);
  // The finest place an uncertainty of at most two figures could have been written to.
  const uFinest = u.figures === 1 && u.finest > u.decimals ? u.decimals + 1 : u.decimals;
  if (v.decimals > uFinest) {
    return { problem: 'value-over-precise', text: `the value ${String(value)} has more decimal places than its uncertainty ${uText}` };
  }
  if (v.finest < u.decimals) {
    return { problem: 'value-under-precise', text: `the value ${String(value)} stops before the last decimal place of its uncertainty ${uText}` };
  }
  return undefined;
}

/**
 * Presentation: each reported value with an uncertainty rounded consistently with it; `points` is the
 * rubric item's worth (0: a warning only).
 */
export function checkRounding(values: Array<[path: string, value: ReportedValue | undefined]>, points: number, drafts: DraftFinding[]): void {
  for (const [path, v] of values) {
    if (!v || v.uncertainty === undefined) continue;
    // A value found rounded more coarsely than its standard error already has its finding.
    if (drafts.some((d) => d.code === 'sig-figs' && d.path === path)) continue;
    const problem = sigFigProblem(v.value, v.uncertainty);
    if (!problem) continue;
    drafts.push({
      code: 'sig-figs',
      detail: problem.problem,
      path,
      stage: 'reporting',
      rubricItem: 'sigFigs',
      itemKey: 'sigFigs',
      severity: points > 0 ? 'error' : 'warning',
      charge: points,
      message: `${problem.text[0].toUpperCase()}${problem.text.slice(1)}. Round the uncertainty to one or two significant figures and the value to the same decimal place.`,
    });
  }
}
