import type { ReportedValue } from '../../../schemas/common.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import { formatEstimate, formatPercent, formatReported, formatTolerance, prettyUnit, relativeDifference } from '../../../reports/format.ts';
import { convertUnit } from '../../../reports/units.ts';
import { SYMBOLS } from './symbols.ts';

/**
 * E_a, A, ΔH‡ and ΔS‡: what the student reported against our refit, their relative difference (the
 * student's value in the refit's unit) and the tolerance, as the sheet and the workspace print them.
 */
export const VALUE_COLUMNS = ['Quantity', 'Reported', 'Refit', 'Difference', 'Tolerance'] as const;

function reportedText(reported: ReportedValue | undefined): string {
  if (!reported) return '—';
  return `${formatReported(reported.value)}${reported.uncertainty === undefined ? '' : ` ± ${formatReported(reported.uncertainty)}`} ${prettyUnit(reported.unit)}`;
}

export function valueRows(settings: Settings, submission: Submission, refit: Refit): string[][] {
  return (Object.keys(SYMBOLS) as Array<keyof typeof SYMBOLS>).map((q) => {
    const reported = submission.reported?.[q];
    const ours = refit[q];
    const theirs = reported && convertUnit(Number(reported.value), reported.unit, ours.unit);
    return [
      SYMBOLS[q],
      reportedText(reported),
      // Two temperatures give an exact line, whose standard errors are not defined (null after JSON).
      Number.isFinite(ours.standardError)
        ? `${formatEstimate(ours.value, ours.standardError)} ${prettyUnit(ours.unit)}`
        : `${formatEstimate(ours.value, undefined)} ${prettyUnit(ours.unit)} (SE not defined with two points)`,
      theirs === undefined ? '—' : formatPercent(relativeDifference(theirs, ours.value)),
      // An absolute tolerance is in the quantity's unit.
      `${formatTolerance(settings.tolerances[q])}${settings.tolerances[q].relative === undefined ? ` ${prettyUnit(settings.units[q])}` : ''}`,
    ];
  });
}
