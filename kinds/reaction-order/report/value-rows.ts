import type { ReportedValue } from '../../../schemas/common.ts';
import type { OrderFit, Refit, Settings, Submission } from '../schemas.ts';
import { formatEstimate, formatNumber, formatPercent, formatReported, formatTolerance, prettyUnit, relativeDifference } from '../../../reports/format.ts';
import { convertUnit } from '../../../reports/units.ts';
import { finiteOrUndefined, gradedK, lawK, type EstimateValue } from './refit.ts';

/**
 * The order and k the student reported against our refit, as the sheet and the workspace print them:
 * the order the data support (or why they cannot tell), and k of the order it was graded by, in the
 * unit the student wrote where the checker could convert to it.
 */
export const VALUE_COLUMNS = ['Quantity', 'Reported', 'Refit', 'Difference', 'Tolerance'] as const;

export function reportedText(reported: ReportedValue | undefined): string {
  if (!reported) return '—';
  const uncertainty = reported.uncertainty === undefined ? '' : ` ± ${formatReported(reported.uncertainty)}`;
  return `${formatReported(reported.value)}${uncertainty} ${prettyUnit(reported.unit)}`.trim();
}

/** An estimate as `value ± SE unit`; an SE lost to JSON (null) is left out. */
export function estimateText(estimate: { value: number; standardError: number | null; unit: string }): string {
  return `${formatEstimate(estimate.value, finiteOrUndefined(estimate.standardError))} ${prettyUnit(estimate.unit)}`;
}

/** The order reported against the refit's, as the refit's verdict on it says (k is graded by the order reported either way). */
function orderRow(submission: Submission, refit: Refit): string[] {
  const reported = String(submission.reported.order);
  switch (refit.orderVerdict) {
    case 'undetermined':
      return ['Order n', reported, `cannot tell: ${refit.orderReason}`, '—', '—'];
    case 'supported':
      return ['Order n', reported, String(refit.order), 'same', '—'];
    case 'not-ruled-out':
      return ['Order n', reported, `${refit.order} (yours is not ruled out)`, 'not ruled out', '—'];
    case 'not-supported':
      return ['Order n', reported, String(refit.order), 'differs', '—'];
  }
}

/** k against an estimate of ours: the difference is read in the estimate's unit (none where the student's cannot be). */
function kRow(label: string, settings: Settings, reported: ReportedValue, ours: EstimateValue | undefined, basis = ''): string[] {
  const theirs = ours && convertUnit(Number(reported.value), reported.unit, ours.unit);
  return [
    label,
    reportedText(reported),
    ours ? `${estimateText(ours)}${basis}` : 'not fitted',
    ours && theirs !== undefined ? formatPercent(relativeDifference(theirs, ours.value)) : '—',
    `${formatTolerance(settings.tolerances.k)}; SE ${formatTolerance(settings.tolerances.kUncertainty)}`,
  ];
}

/**
 * An order's k nearest the reported one of the two the checker accepts, the fit to [A] and the
 * straight line (named where it is the line), so a k right by the line does not show the fit's gap.
 */
function nearestLawK(reported: ReportedValue, fit: OrderFit): { ours: EstimateValue | undefined; basis: string } {
  const [fitted, line] = [fit.nonlinear?.k ?? undefined, fit.linear?.k ?? undefined];
  if (!fitted || !line) return { ours: fitted ?? line, basis: '' };
  const gap = (k: EstimateValue) => Math.abs((convertUnit(Number(reported.value), reported.unit, k.unit) ?? Number.NaN) - k.value);
  return gap(line) < gap(fitted) ? { ours: line, basis: ' (line)' } : { ours: fitted, basis: '' };
}

/**
 * The order, and k against the law of the order reported (the graded one); where the data name another
 * order, also against that order's k, so that the student sees the k their data support.
 */
export function valueRows(settings: Settings, submission: Submission, refit: Refit): string[][] {
  const { order, k } = submission.reported;
  const named = refit.order !== null && refit.order !== order ? [kRow(`k (order ${refit.order}, the order named)`, settings, k, lawK(refit.byOrder[refit.order]))] : [];
  const graded = refit.kDeclared ? { ours: gradedK(refit), basis: '' } : nearestLawK(k, refit.byOrder[refit.gradedOrder]);
  return [orderRow(submission, refit), kRow(`k (order ${refit.gradedOrder})`, settings, k, graded.ours, graded.basis), ...named];
}
/** Per run: [A]_0, how far it reacted, the half-life reported against ours (in the assignment's time unit). */
export const HALF_LIFE_COLUMNS = ['Run', '[A]_{0}', 'Reacted', 'Reported t_{1/2}', 'Refit t_{1/2}', 'Difference', 'Tolerance'] as const;

export function halfLifeRows(settings: Settings, submission: Submission, refit: Refit): string[][] {
  return refit.runs.map((run, i) => {
    const reported = submission.runs[i]?.reported?.halfLife;
    const ours = run.halfLife;
    const theirs = reported && ours && convertUnit(Number(reported.value), reported.unit, ours.unit);
    return [
      `“${run.label}”`,
      `${formatNumber(run.initialConcentration, 3)} M`,
      `${formatNumber(100 * run.fractionReacted, 2)} %`,
      reportedText(reported),
      ours ? estimateText(ours) : '—',
      ours && theirs !== undefined ? formatPercent(relativeDifference(theirs, ours.value)) : '—',
      formatTolerance(settings.tolerances.halfLife),
    ];
  });
}
