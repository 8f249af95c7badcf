import type { DisplayPlot, KindDisplay } from '../../../schemas/display.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import type { FeedbackInput } from '../../../reports/feedback-input.ts';
import { crosses, displayAxis, inside } from '../../../reports/display/plot-axes.ts';
import { nearValues } from '../../../reports/pdf/scale.ts';
import { rateLawSeries, type RateLawSeries } from './rate-law-series.ts';
import { runTitle } from './run-plots.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';
import { allRunSeries, type RunSeries } from './run-series.ts';
import { valueRows, valuesNote } from './values-table.ts';
import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { readRefit } from './refit.ts';
import { equilibriumNote, equilibriumRows } from './equilibrium-rows.ts';
import { constantPlot } from './equilibrium-display.ts';

/**
 * The first kind on the workspace's student page: the sheet's table of values and its plots, made by
 * the sheet's functions: ln F against t for the runs of each time unit (each run's points, our line,
 * the student's line where the run has a finding), and k_obs against [catalyst] with both lines.
 */
const at = (line: Line, x: number) => line.intercept + line.slope * x;

/** The runs timed in one unit, on one plot: a run's colour is its group. */
function lnFPlot(runs: RunSeries[]): DisplayPlot {
  const timeUnit = prettyUnit(runs[0].timeUnit);
  const tMax = Math.max(...runs.flatMap((r) => [...r.points, ...r.ours].map((p) => p.t)));
  const data = runs.flatMap((r) => [...r.points.map((p) => p.y), at(r.ourLine, 0), at(r.ourLine, tMax)]);
  const theirs = runs.flatMap((r) => (r.theirLine ? [at(r.theirLine, 0), at(r.theirLine, tMax)] : []));
  const axes = { x: displayAxis(`t / ${timeUnit}`, [0, tMax], { includeZero: true, pad: 0 }), y: displayAxis('ln F', nearValues(data, theirs), { includeZero: true, pad: 0.03 }) };
  const notes = runs.flatMap((r) => {
    const perTime = `${prettyUnit(r.timeUnit)}⁻¹`;
    if (r.theirLine) {
      const beyond = crosses(axes, r.theirLine) ? '' : ', beyond the plot';
      return [`${runTitle(r)}: refit k_{obs} = ${formatNumber(r.ourK)} ${perTime}; the student’s ${formatNumber(r.theirK!)} ${perTime} (dashed${beyond})`];
    }
    return r.note ? [`${runTitle(r)}: ${r.note.replace(/^your/, 'the student’s')}`] : [];
  });
  return {
    title: `ln F against t, runs timed in ${timeUnit}`,
    ...axes,
    groups: runs.map(runTitle),
    series: runs.flatMap((r, group) => [
      { group, owner: r.studentPoints ? ('student' as const) : ('refit' as const), points: r.points.map((p): [number, number] => [p.t, p.y]) },
      { group, owner: 'refit' as const, line: r.ourLine },
      ...(r.theirLine ? [{ group, owner: 'student' as const, line: r.theirLine }] : []),
    ]),
    legend: [
      ...runs.map((r, group) => ({ label: runTitle(r), mark: r.studentPoints ? ('diamond' as const) : ('disc' as const), group })),
      { label: 'refit line', mark: 'line' as const },
      ...(runs.some((r) => r.theirLine) ? [{ label: 'line with the student’s k_{obs} (runs with a finding)', mark: 'dash' as const }] : []),
    ],
    notes,
  };
}

function rateLawPlot(series: RateLawSeries): DisplayPlot {
  const cMax = Math.max(...series.ours.map((p) => p.c));
  const lineEnds = (line: Line | undefined) => (line ? [at(line, 0), at(line, cMax)] : []);
  const data = [0, ...series.ours.flatMap((p) => [p.k - p.se, p.k + p.se]), ...lineEnds(series.ourLine)];
  const theirs = [...series.theirs.map((p) => p.k), ...lineEnds(series.theirLine)];
  const axes = { x: displayAxis('[catalyst] / M', [0, cMax], { includeZero: true, pad: 0 }), y: displayAxis(`k_{obs} / ${prettyUnit(series.kUnit)}`, nearValues(data, theirs), { pad: 0.05 }) };
  const offScale = series.theirs.filter((p) => !inside(axes, p.c, p.k)).length;
  const unit = prettyUnit(series.kUnit);
  const lineText = (who: string, line: Line | undefined) => (line ? [`${who}: k_{N} = ${formatNumber(line.intercept)} ${unit}, k_{A} = ${formatNumber(line.slope)} M⁻¹ ${unit}`] : []);
  return {
    title: 'Rate law: k_{obs} against [catalyst]',
    ...axes,
    groups: ['refit', 'the student’s'],
    series: [
      { group: 0, owner: 'refit', points: series.ours.map((p): [number, number] => [p.c, p.k]) },
      ...(series.ourLine ? [{ group: 0, owner: 'refit' as const, line: series.ourLine }] : []),
      { group: 1, owner: 'student', points: series.theirs.map((p): [number, number] => [p.c, p.k]) },
      ...(series.theirLine ? [{ group: 1, owner: 'student' as const, line: series.theirLine }] : []),
    ],
    legend: [
      { label: 'refit k_{obs}', mark: 'disc', group: 0 },
      { label: 'refit k_{obs} = k_{N} + k_{A}[catalyst]', mark: 'line', group: 0 },
      ...(series.theirs.length ? [{ label: 'the student’s k_{obs}', mark: 'diamond' as const, group: 1 }] : []),
      ...(series.theirLine ? [{ label: 'the student’s k_{N} and k_{A}', mark: 'dash' as const, group: 1 }] : []),
    ],
    notes: [
      ...lineText('Refit', series.ourLine),
      ...lineText('The student’s', series.theirLine),
      ...series.notes.map((n) => n.replace(/^Your line/, 'The student’s line').replace(/\byour\b/g, 'their').replace(/\bYour\b/g, 'Their')),
      ...(offScale > 0 ? [`${offScale} of the student’s k_{obs} values lie beyond the plotted range (see the table).`] : []),
    ],
  };
}

export function firstOrderCatalysisDisplay(input: FeedbackInput<Settings, Submission, Refit>): KindDisplay {
  const { settings, submission } = input;
  const refit = readRefit(input.result);
  if (!refit) return { comparison: null, plots: [] };
  const equilibrium = settings.equilibrium && refit.equilibrium;
  // The equilibrium block's rows follow the values', in the same columns.
  const rows = [...valueRows(settings, submission, refit), ...(equilibrium ? equilibriumRows(settings.equilibrium!, submission, equilibrium) : [])];
  const kPlot = equilibrium ? constantPlot(submission, equilibrium) : undefined;
  const runs = allRunSeries(settings, submission.runs, refit, input.result.findings).filter((s): s is RunSeries => s !== undefined && s.points.length > 0);
  // One time unit on one axis: runs timed in minutes and in seconds are two plots, never rescaled.
  const units = [...new Set(runs.map((r) => r.timeUnit))];
  const law = rateLawSeries(settings, submission, refit);
  return {
    comparison: rows.length
      ? {
          caption: 'Reported values against the refit from the student’s own readings',
          note: valuesNote(settings, 'the student’s') + (equilibrium ? ` Equilibrium: ${equilibriumNote(settings.equilibrium!, equilibrium, 'the student’s')}` : ''),
          columns: [
            { header: 'Quantity', numeric: false },
            { header: 'Run', numeric: false },
            { header: 'Reported', numeric: true },
            { header: 'Refit', numeric: true },
            { header: 'Unit', numeric: false },
            { header: 'Difference', numeric: true },
            { header: 'Tolerance', numeric: false },
          ],
          rows: rows.map((r) => [r.quantity, r.run, r.reported, r.refit, r.unit, r.difference, r.tolerance]),
        }
      : null,
    plots: [...units.map((unit) => lnFPlot(runs.filter((r) => r.timeUnit === unit))), ...(law ? [rateLawPlot(law)] : []), ...(kPlot ? [kPlot] : [])],
  };
}
