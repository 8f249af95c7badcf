import type { DisplayPlot, KindDisplay } from '../../../schemas/display.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import type { FeedbackInput } from '../../../reports/feedback-input.ts';
import { crosses, displayAxis } from '../../../reports/display/plot-axes.ts';
import { prettyUnit } from '../../../reports/format.ts';
import { lastTime, lawYValues } from './law-axes.ts';
import { allLawSeries, lineTexts, orderTags, type LawSeries } from './law-series.ts';
import { LAWS, lawTitle } from './laws.ts';
import { refitOf } from './refit.ts';
import { fitRows } from './fit-rows.ts';
import { valuesNote } from './sheet-data.ts';
import { HALF_LIFE_COLUMNS, halfLifeRows, VALUE_COLUMNS, valueRows } from './value-rows.ts';

/**
 * The kind on the workspace's student page, made by the sheet's functions: one table with the order,
 * k, each order's fit and the half-lives, and the three plots ([A], ln [A] and 1/[A] against t), a run
 * a colour, our line per run and the student's on the plot of the order they report.
 */
function lawPlot(series: LawSeries): DisplayPlot {
  const axes = { x: displayAxis(`t / ${prettyUnit(series.timeUnit)}`, [0, lastTime(series)], { includeZero: true, pad: 0 }), y: displayAxis(LAWS[series.order].yLabel, lawYValues(series), { pad: 0.04 }) };
  const theirs = series.runs.flatMap((r) => (r.theirLine ? [r.theirLine] : []));
  const beyond = theirs.length > 0 && !theirs.some((line) => crosses(axes, line));
  const tags = orderTags(series, 'the student’s');
  return {
    title: lawTitle(series.order),
    ...axes,
    groups: series.runs.map((r) => `run “${r.label}”`),
    series: series.runs.flatMap((run, group) => [
      { group, owner: 'refit' as const, points: run.points.map((p): [number, number] => [p.t, p.y]) },
      ...(run.ourLine ? [{ group, owner: 'refit' as const, line: run.ourLine }] : []),
      ...(run.theirLine ? [{ group, owner: 'student' as const, line: run.theirLine }] : []),
    ]),
    legend: [
      ...series.runs.map((r, group) => ({ label: `run “${r.label}”`, mark: 'disc' as const, group })),
      { label: 'refit line', mark: 'line' as const },
      ...(theirs.length ? [{ label: 'line with the student’s k', mark: 'dash' as const }] : []),
    ],
    // The page shows no plot title: the first note names the plot, and whose order it is.
    notes: [
      tags ? `${lawTitle(series.order)}: ${tags}` : lawTitle(series.order),
      ...lineTexts(series, 'the student’s', beyond).filter((line) => !line.startsWith(`order ${series.order}:`)),
      ...series.notes.map((n) => n.replace(/^Your line/, 'The student’s line')),
    ],
  };
}

export function reactionOrderDisplay(input: FeedbackInput<Settings, Submission, Refit>): KindDisplay {
  const { settings, submission } = input;
  const refit = refitOf(input.result);
  if (!refit) return { comparison: null, plots: [] };
  // One table of five columns: the fits and half-lives are folded into its cells, a line each.
  const fits = fitRows(settings, refit).map(([order, line, kLine, kFit, sd, p, tag]) => [`Order ${order} fit (${line})${tag ? `, ${tag}` : ''}`, '—', `line: ${kLine}\nfit to [A]: ${kFit}\nresidual SD ${sd}, pattern p ${p}`, '—', '—']);
  const halfLives = halfLifeRows(settings, submission, refit).map(([run, c0, reacted, reported, ours, difference, tolerance]) => [`t_{1/2}, run ${run}`, reported, `${ours}\n[A]_{0} ${c0}, ${reacted} reacted`, difference, tolerance]);
  return {
    comparison: {
      caption: 'Reported order, k and half-lives against the refit from the student’s own readings',
      note: valuesNote('the student’s'),
      columns: VALUE_COLUMNS.map((header) => ({ header, numeric: header === 'Reported' || header === 'Refit' || header === 'Difference' })),
      rows: [...valueRows(settings, submission, refit), ...fits, ...halfLives],
    },
    plots: allLawSeries(refit, submission.reported, settings.units.time).filter((s) => s.runs.some((r) => r.points.length > 0)).map(lawPlot),
  };
}
