import type { Submission } from './schemas.ts';

/** A run's ln F against t since its first reading, from the submission's readings (the refit keeps no arrays). */
export function lnFPoints(run: Submission['runs'][number]): Array<[number, number]> {
  const [t0, x0] = run.readings[0];
  return run.readings.flatMap(([t, x]): Array<[number, number]> => {
    const f = (x - run.infinity) / (x0 - run.infinity);
    return f > 0 ? [[t - t0, Math.log(f)]] : [];
  });
}

/** The x axis's label: the runs' time unit, where they share one. */
export function timeLabel(submission: Submission): string {
  const units = [...new Set(submission.runs.map((r) => r.timeUnit))];
  return units.length === 1 ? `t / ${units[0]}` : 't (each run in its own unit)';
}
