import type { NumberLike, ReportedValue } from '../../schemas/common.ts';
import type { DraftFinding } from './draft-finding.ts';
import { decimalsOf } from './digit-slips.ts';

/**
 * Rounding of a value against its uncertainty: the uncertainty to 1 or 2 significant figures and the
 * value to the same decimal place (common practice, no source). A number sent as JSON has lost its
 * trailing zeros, so from a number only over-precision is judged, never too few digits, and a
 * one-figure uncertainty is allowed the second figure it may have had.
 */
export interface SigFigProblem {
  problem: 'uncertainty-digits' | 'value-over-precise' | 'value-under-precise';
  text: string;
}

function decimalsOfText(text: string): number {
  const t = text.trim().toLowerCase();
  const [mantissa, exp] = t.split('e');
  const dot = mantissa.indexOf('.');
  const places = dot < 0 ? 0 : mantissa.length - dot - 1;
  return places - (exp ? Number(exp) : 0);
}

/** Decimal places as written: from a string exactly, from a JSON number as it prints. */
export function writtenDecimals(value: NumberLike): number {
  return typeof value === 'string' ? decimalsOfText(value) : decimalsOf(value);
}

/** The digits of the mantissa from the first that is not zero: every reported value passes here. */
function significantFiguresOfText(text: string): number {
  let figures = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x65 || c === 0x45) break; // e, E: the exponent follows
    if (c >= 0x30 && c <= 0x39 && (figures > 0 || c !== 0x30)) figures++;
  }
  return figures;
}

export function sigFigProblem(value: NumberLike, uncertainty: NumberLike): SigFigProblem | undefined {
  if (Number(uncertainty) === 0) return undefined;
  const uText = String(uncertainty);
  const uFigures = significantFiguresOfText(uText);
  if (uFigures > 2) {
    return { problem: 'uncertainty-digits', text: `the uncertainty ${uText} has ${uFigures} significant figures; 1 or 2 are meaningful` };
  }
  const exactTexts = typeof value === 'string' && typeof uncertainty === 'string';
  const uDecimals = writtenDecimals(uncertainty);
  const vDecimals = writtenDecimals(value);
  // A JSON number has lost its trailing zeros: an uncertainty that shows one figure may have had two.
  const uMayHaveLostZero = typeof uncertainty === 'number' && uFigures === 1;
  if (vDecimals > uDecimals + (uMayHaveLostZero ? 1 : 0)) {
    return { problem: 'value-over-precise', text: `the value ${String(value)} has more decimal places than its uncertainty ${uText}` };
  }
  if (exactTexts && vDecimals < uDecimals) {
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
