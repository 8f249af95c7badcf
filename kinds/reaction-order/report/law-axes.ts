import type { Line } from '../../../reports/feedback/plot-lines.ts';
import { nearValues } from '../../../reports/pdf/scale.ts';
import type { LawSeries } from './law-series.ts';

const at = (line: Line, t: number) => line.intercept + line.slope * t;

/** The last time of any run. */
export const lastTime = (series: LawSeries): number => Math.max(0, ...series.runs.flatMap((r) => r.points.map((p) => p.t)));

/**
 * The values the y axis spans: the points and our lines always, the student's lines only while near
 * them, so that a k off by a factor of 60 does not flatten the data to a stripe (the sheet says so).
 */
export function lawYValues(series: LawSeries): number[] {
  const tMax = lastTime(series);
  const ends = (line: Line | undefined) => (line ? [at(line, 0), at(line, tMax)] : []);
  const data = series.runs.flatMap((r) => [...r.points.map((p) => p.y), ...ends(r.ourLine)]);
  return nearValues(data.length ? data : [0, 1], series.runs.flatMap((r) => ends(r.theirLine)));
}
