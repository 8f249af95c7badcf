import type { DisplayPlot } from '../../../schemas/display.ts';
import type { EquilibriumRefit, Submission } from '../schemas.ts';
import { displayAxis, inside } from '../../../reports/display/plot-axes.ts';
import { formatEstimate } from '../../../reports/format.ts';
import { nearValues } from '../../../reports/pdf/scale.ts';
import { runLabel } from './paths.ts';

const K_SPAN = 0.03;

/**
 * K run by run for the workspace's student page: our K of each run (discs, with the mean K as a
 * level line) and the student's (diamonds), run numbers along the x axis as in the sheet's table.
 */
export function constantPlot(submission: Submission, refit: EquilibriumRefit): DisplayPlot | undefined {
  const ours = refit.runs.flatMap((r, i): Array<[number, number]> => (r?.K ? [[i + 1, r.K.value]] : []));
  if (ours.length === 0) return undefined;
  const theirs = submission.runs.flatMap((run, i): Array<[number, number]> => {
    const K = Number(run.reported?.K?.value);
    return run.reported?.K && Number.isFinite(K) ? [[i + 1, K]] : [];
  });
  const mean = refit.meanK;
  const axes = {
    x: displayAxis('run', [0.5, submission.runs.length + 0.5], { pad: 0 }),
    // At least ±3 % of the mean K: runs that agree then lie on a level line, and one apart stands out.
    y: displayAxis('K', nearValues([...ours.map((p) => p[1]), ...(mean ? [mean.value * (1 - K_SPAN), mean.value * (1 + K_SPAN)] : [])], theirs.map((p) => p[1])), { pad: 0.1 }),
  };
  const off = theirs.filter(([x, y]) => !inside(axes, x, y)).length;
  return {
    title: 'Equilibrium constant K, run by run',
    ...axes,
    groups: ['refit', 'the student’s'],
    series: [
      { group: 0, owner: 'refit', points: ours },
      ...(mean ? [{ group: 0, owner: 'refit' as const, line: { intercept: mean.value, slope: 0 } }] : []),
      ...(theirs.length ? [{ group: 1, owner: 'student' as const, points: theirs }] : []),
    ],
    legend: [
      { label: 'refit K of a run', mark: 'disc', group: 0 },
      ...(mean ? [{ label: 'refit mean K', mark: 'line' as const, group: 0 }] : []),
      ...(theirs.length ? [{ label: 'the student’s K', mark: 'diamond' as const, group: 1 }] : []),
    ],
    notes: [
      ...refit.runs.flatMap((r, i) => (r && !r.K ? [`${runLabel(submission, i)}: x_{B} lies outside 0 to 1, no K.`] : [])),
      ...(mean ? [`Refit mean K = ${formatEstimate(mean.value, mean.standardError)} over ${mean.n} run${mean.n === 1 ? '' : 's'}; K should be the same in every run.`] : []),
      ...(off > 0 ? [`${off} of the student’s K values lie beyond the plotted range (see the table).`] : []),
    ],
  };
}
