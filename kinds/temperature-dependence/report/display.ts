import type { DisplayPlot, KindDisplay } from '../../../schemas/display.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import { crosses, displayAxis } from '../../../reports/display/plot-axes.ts';
import { nearValues } from '../../../reports/pdf/scale.ts';
import type { FeedbackInput } from '../../../reports/feedback-input.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';
import { formatNumber } from '../../../reports/format.ts';
import { arrheniusSeries, eyringSeries, type ActivationSeries } from './activation-series.ts';
import { VALUE_COLUMNS, valueRows } from './value-rows.ts';

/**
 * The second kind on the workspace's student page: the sheet's table of values (with the relative
 * difference) and its Arrhenius and Eyring plots, each with our line and the student's.
 */
const at = (line: Line, x: number) => line.intercept + line.slope * x;

function activationPlot(series: ActivationSeries, title: string, yLabel: string, describeLine: (line: Line) => string): DisplayPlot {
  const xs = series.points.map((p) => p.x);
  const [xMin, xMax] = [Math.min(...xs), Math.max(...xs)];
  const data = [...series.points.map((p) => p.y), at(series.ourLine, xMin), at(series.ourLine, xMax)];
  const theirs = series.theirLine ? [at(series.theirLine, xMin), at(series.theirLine, xMax)] : [];
  const axes = { x: displayAxis('1000 K / T', xs, { pad: 0.05 }), y: displayAxis(yLabel, nearValues(data, theirs), { pad: 0.08 }) };
  const theirText = series.theirLine && `the student’s (dashed${crosses(axes, series.theirLine) ? '' : ', beyond the plot'}): ${describeLine(series.theirLine)}`;
  return {
    title,
    ...axes,
    groups: ['refit', 'the student’s'],
    series: [
      { group: 0, owner: 'refit', points: series.points.map((p): [number, number] => [p.x, p.y]) },
      { group: 0, owner: 'refit', line: series.ourLine },
      ...(series.theirLine ? [{ group: 1, owner: 'student' as const, line: series.theirLine }] : []),
    ],
    legend: [
      { label: 'k at each temperature (refitted where given as readings)', mark: 'disc', group: 0 },
      { label: 'refit line', mark: 'line', group: 0 },
      ...(series.theirLine ? [{ label: 'line from the student’s reported values', mark: 'dash' as const, group: 1 }] : []),
    ],
    notes: [`refit: ${describeLine(series.ourLine)}`, theirText ?? series.note?.replace(/^Your line/, 'The student’s line')].filter((n): n is string => n !== undefined),
  };
}

export function temperatureDependenceDisplay(input: FeedbackInput<Settings, Submission, Refit>): KindDisplay {
  const { settings, submission } = input;
  const refit = input.result.refit;
  if (!refit) return { comparison: null, plots: [] };
  const arrhenius = arrheniusSeries(refit, submission.reported);
  const eyring = eyringSeries(refit, submission.reported);
  return {
    comparison: {
      caption: 'Reported values against the refit from the student’s own rate constants',
      note: 'Refit: our own straight-line fit of the rate constants against 1/T (temperatures in kelvin, k per second for Eyring), with its standard error. Difference: (reported − refit) / refit, the reported value in the refit’s unit.',
      columns: VALUE_COLUMNS.map((header) => ({ header, numeric: header === 'Reported' || header === 'Refit' || header === 'Difference' })),
      rows: valueRows(settings, submission, refit),
    },
    plots: [
      ...(arrhenius ? [activationPlot(arrhenius, 'Arrhenius: ln k against 1/T', 'ln(k / s^{−1})', (line) => `slope ${formatNumber(line.slope)}, ln(A / s^{−1}) = ${formatNumber(line.intercept)}`)] : []),
      ...(eyring ? [activationPlot(eyring, 'Eyring: ln(k/T) against 1/T', 'ln[(k/T) / (s^{−1} K^{−1})]', (line) => `slope ${formatNumber(line.slope)}, intercept ${formatNumber(line.intercept)}`)] : []),
    ],
  };
}
