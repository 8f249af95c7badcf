import type { Order, Refit, Submission } from '../schemas.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';
import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { convertUnit } from '../../../reports/units.ts';
import { LAWS } from './laws.ts';
import { kUnitOfOrder } from './refit.ts';

/**
 * What one order's plot shows, t in the assignment's time unit and [A] in M: each run's converted
 * readings in the law's straight-line form, our line per run (the law's linear fit: its k and the run's
 * own intercept) and, on the plot of the order the student reported, their line per run (their k as
 * the slope, through the run's points, since they report no intercept).
 */
export interface RunLine {
  label: string;
  points: Array<{ t: number; y: number }>;
  ourLine?: Line;
  theirLine?: Line;
}

export interface LawSeries {
  order: Order;
  timeUnit: string;
  runs: RunLine[];
  /** k of the straight line, as printed under the plot, and the student's where drawn. */
  ourK?: { value: number; unit: string };
  theirK?: number;
  /** Readings without a value in this form (ln or 1/x of a concentration at or below zero). */
  leftOut: number;
  /** Whether the refit names this order, and whether the student reported it. */
  named: boolean;
  reported: boolean;
  /** Why a line is missing. */
  notes: string[];
}

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

/** The least-squares intercept for a fixed slope: the line through the points' centroid. */
function throughPoints(points: RunLine['points'], slope: number): Line {
  return { slope, intercept: mean(points.map((p) => p.y)) - slope * mean(points.map((p) => p.t)) };
}

export function lawSeries(refit: Refit, reported: Submission['reported'], order: Order, timeUnit: string): LawSeries {
  const law = LAWS[order];
  const fit = refit.byOrder[order];
  let leftOut = 0;
  const runs: RunLine[] = refit.runs.map((run) => {
    const points = run.times.flatMap((t, i) => {
      const y = law.y(run.concentrations[i]);
      if (y === undefined) leftOut += 1;
      return y === undefined ? [] : [{ t, y }];
    });
    return { label: run.label, points };
  });
  const notes: string[] = [];
  const linear = fit?.linear;
  // A run the form cannot take (too few readings with a logarithm, say) has no intercept, and no line.
  if (linear) runs.forEach((run, r) => {
    const intercept: number | null | undefined = linear.intercepts[r];
    if (typeof intercept === 'number' && Number.isFinite(intercept)) run.ourLine = { intercept, slope: law.slope * linear.k.value };
  });
  else notes.push(`No refit line: ${fit?.notFitted ?? 'the law could not be fitted to these readings'}.`);

  const series: LawSeries = { order, timeUnit, runs, leftOut, named: refit.order === order, reported: reported.order === order, notes, ...(linear && { ourK: { value: linear.k.value, unit: linear.k.unit } }) };
  if (!series.reported) return series;
  const unit = kUnitOfOrder(refit, order);
  const theirK = unit === undefined ? undefined : convertUnit(Number(reported.k.value), reported.k.unit, unit);
  if (theirK === undefined) {
    notes.push(`Your line is not drawn: k in “${prettyUnit(reported.k.unit)}” could not be read as a rate constant of order ${order}${unit ? ` (${prettyUnit(unit)})` : ''}.`);
    return series;
  }
  runs.forEach((run) => {
    if (run.points.length > 0) run.theirLine = throughPoints(run.points, law.slope * theirK);
  });
  return { ...series, theirK };
}

/** The three plots' series, orders 0, 1 and 2. */
export function allLawSeries(refit: Refit, reported: Submission['reported'], timeUnit: string): LawSeries[] {
  return ([0, 1, 2] as const).map((order) => lawSeries(refit, reported, order, timeUnit));
}

/** Whose order the plot's is: `named by the refit, your order`, or '' for neither. */
export function orderTags(series: LawSeries, whose: 'your' | 'the student’s'): string {
  return [series.named ? 'named by the refit' : '', series.reported ? `${whose} order` : ''].filter(Boolean).join(', ');
}

/** The words under a plot: whose order it is (the sheet's plot titles name the order), the refit line's k, and the student's on their order's plot. */
export function lineTexts(series: LawSeries, whose: 'your' | 'the student’s', beyond: boolean): string[] {
  const unit = series.ourK ? ` ${prettyUnit(series.ourK.unit)}` : '';
  const tags = orderTags(series, whose);
  return [
    ...(tags ? [`order ${series.order}: ${tags}`] : []),
    ...(series.ourK ? [`refit line: k = ${formatNumber(series.ourK.value)}${unit}`] : []),
    ...(series.theirK !== undefined ? [`${whose} k = ${formatNumber(series.theirK)}${unit} (dashed${beyond ? ', beyond the plot' : ''})`] : []),
    ...(series.leftOut > 0 ? [`${series.leftOut} reading(s) at or below zero have no ${LAWS[series.order].plotted}`] : []),
  ];
}
