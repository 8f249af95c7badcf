import type { ReportedValue } from '../../../schemas/common.ts';
import type { Estimate } from '../../../schemas/result.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import type { z } from 'zod';
import { formatEstimate, formatPercent, formatReported, formatTolerance, prettyUnit, relativeDifference } from '../../../reports/format.ts';
import { runLabel } from './paths.ts';

type EstimateValue = z.infer<typeof Estimate>;

/** One row of the reported-against-refit table, as printed (markup for sub/superscripts). */
export interface ValueRow {
  quantity: string;
  run: string;
  reported: string;
  refit: string;
  unit: string;
  difference: string;
  tolerance: string;
}

function reportedText(reported: ReportedValue | undefined, refitUnit: string): string {
  if (!reported) return '—';
  const value = formatReported(reported.value);
  const withUncertainty = reported.uncertainty === undefined ? value : `${value} ± ${formatReported(reported.uncertainty)}`;
  // The student's unit is named when it is not the unit of the refit column.
  return reported.unit.trim() === refitUnit.trim() ? withUncertainty : `${withUncertainty} ${prettyUnit(reported.unit)}`;
}

function difference(reported: ReportedValue | undefined, refit: EstimateValue | undefined): string {
  if (!reported || !refit) return '—';
  return formatPercent(relativeDifference(Number(reported.value), refit.value));
}

const tolerancePair = (value: Parameters<typeof formatTolerance>[0], uncertainty: Parameters<typeof formatTolerance>[0]) =>
  `${formatTolerance(value)}; SE ${formatTolerance(uncertainty)}`;

/**
 * Per run k_obs, then k_N and k_A: what the student reported against our refit, compared in the unit
 * the student declared where the checker converted to it, with the tolerances the checker used.
 */
export function valueRows(settings: Settings, submission: Submission, refit: Refit): ValueRow[] {
  const t = settings.tolerances;
  const rows: ValueRow[] = refit.runs.map((run, i) => {
    const reported = submission.runs[i]?.reported?.k;
    if (!run.k) {
      const unit = reported?.unit ?? settings.units.k;
      return { quantity: 'k_{obs}', run: runLabel(submission, i).replace(/^Run /, ''), reported: reportedText(reported, unit), refit: 'not fitted', unit: prettyUnit(unit), difference: '—', tolerance: tolerancePair(t.k, t.kUncertainty) };
    }
    const estimate = run.k.declared ?? run.k.instructor;
    return {
      quantity: 'k_{obs}',
      run: runLabel(submission, i).replace(/^Run /, ''),
      reported: reportedText(reported, estimate.unit),
      refit: formatEstimate(estimate.value, estimate.standardError),
      unit: prettyUnit(estimate.unit),
      difference: difference(reported, estimate),
      tolerance: tolerancePair(t.k, t.kUncertainty),
    };
  });
  const lawRow = (quantity: string, reported: ReportedValue | undefined, estimate: EstimateValue | undefined, own: EstimateValue | undefined, tolerance: Parameters<typeof formatTolerance>[0]): ValueRow => ({
    quantity,
    run: 'all runs',
    reported: reportedText(reported, estimate?.unit ?? reported?.unit ?? ''),
    refit:
      (estimate ? formatEstimate(estimate.value, estimate.standardError) : '—') +
      (own ? `\nfrom your own k values: ${formatEstimate(own.value, own.standardError)}` : ''),
    unit: prettyUnit(estimate?.unit ?? reported?.unit ?? ''),
    difference: difference(reported, estimate),
    tolerance: tolerancePair(tolerance, t.rateLawUncertainty),
  });
  const own = refit.fromReportedK;
  const ownDiffers = (ours: EstimateValue | undefined, theirs: EstimateValue | undefined) =>
    theirs && ours && Math.abs(theirs.value - ours.value) > 1e-3 * Math.abs(ours.value) ? theirs : undefined;
  if (refit.kN || submission.reported?.kN) rows.push(lawRow('k_{N}', submission.reported?.kN, refit.kN, ownDiffers(refit.kN, own?.kN), t.kN));
  if (refit.kA || submission.reported?.kA) rows.push(lawRow('k_{A}', submission.reported?.kA, refit.kA, ownDiffers(refit.kA, own?.kA), t.kA));
  return rows;
}

const MODEL_WORDS = { origin: 'through the origin', intercept: 'with an intercept' } as const;

/** How the table reads, for the student (`your`) or for a TA (`the student’s`). */
export function valuesNote(settings: Settings, whose: 'your' | 'the student’s'): string {
  return (
    `Refit: our own fit of ${whose} readings, ln F against t ${MODEL_WORDS[settings.fitModel]} as the assignment asks, then ` +
    `each run’s rate constant against the catalyst concentration (${settings.rateLawFit} least squares); values ± standard error (SE). ` +
    `Difference: (${whose === 'your' ? 'yours' : 'reported'} − refit) / refit. A value within its tolerance of the refit counts as agreeing.`
  );
}
