import type { Refit, RunRefit, Settings, SubmittedRun } from '../schemas.ts';
import type { Finding } from '../../../schemas/result.ts';
import { convertUnit } from '../../../reports/units.ts';
import { prettyUnit } from '../../../reports/format.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';

/**
 * What the ln F plot of one run shows: the student's points (their ln F column where given, else ours),
 * our fitted line, and the student's line (slope −k in the run's time unit) where the run has a finding
 * or their k differs from ours beyond the tolerance. Times are counted from the first reading, as in the refit.
 */
export interface Point {
  t: number;
  y: number;
  /** Index of the reading. */
  index: number;
}

export interface RunSeries {
  index: number;
  label: string;
  temperatureC?: number;
  timeUnit: string;
  points: Point[];
  /** Whether `points` are the student's own ln F column. */
  studentPoints: boolean;
  /** Our ln F, for residuals (null where undefined). */
  ours: Point[];
  ourLine: Line;
  ourK: number;
  theirLine?: Line;
  theirK?: number;
  /** Why the student's line is missing although they reported a k. */
  note?: string;
  /** Readings named by a suspect-reading finding. */
  suspect: number[];
}

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

/** Least-squares intercept for a fixed slope: the line through the points' centroid. */
function centredIntercept(points: Point[], slope: number): number {
  return points.length === 0 ? 0 : mean(points.map((p) => p.y)) - slope * mean(points.map((p) => p.t));
}

function suspectReadings(findings: Finding[], index: number): number[] {
  const pattern = new RegExp(`^runs\\[${index}\\]\\.readings(?:\\[(\\d+)\\])?`);
  return findings
    .filter((f) => f.code === 'suspect-reading' || (f.alsoCodes ?? []).includes('suspect-reading'))
    .map((f) => pattern.exec(f.path))
    .filter((m): m is RegExpExecArray => m !== null)
    .map((m) => (m[1] === undefined ? -1 : Number(m[1])));
}

function withinTolerance(settings: Settings, theirs: number, ours: number): boolean {
  const { relative = 0, absolute = 0 } = settings.tolerances.k;
  return Math.abs(theirs - ours) <= Math.max(relative * Math.abs(ours), absolute);
}

export function runSeries(settings: Settings, run: SubmittedRun, refitRun: RunRefit, index: number, findings: Finding[]): RunSeries | undefined {
  if (!refitRun.lnF || !refitRun.k || run.readings.length === 0) return undefined;
  const perTime = `${run.timeUnit}^-1`;
  const instructor = refitRun.k.instructor;
  const ourK = convertUnit(instructor.value, instructor.unit, perTime);
  if (ourK === undefined) return undefined;
  const t0 = run.readings[0][0];
  const ours: Point[] = [];
  refitRun.lnF.forEach((y, i) => {
    if (y !== null && run.readings[i]) ours.push({ t: run.readings[i][0] - t0, y, index: i });
  });
  const column = run.reported?.lnF;
  const theirs: Point[] = [];
  column?.forEach((cell, i) => {
    const y = cell === null ? NaN : Number(cell);
    if (Number.isFinite(y) && run.readings[i]) theirs.push({ t: run.readings[i][0] - t0, y, index: i });
  });
  const studentPoints = theirs.length > 0;
  const ourLine = { slope: -ourK, intercept: refitRun.model === 'intercept' ? centredIntercept(ours, -ourK) : 0 };
  const series: RunSeries = {
    index,
    label: run.label,
    temperatureC: run.temperatureC,
    timeUnit: run.timeUnit,
    points: studentPoints ? theirs : ours,
    studentPoints,
    ours,
    ourLine,
    ourK,
    suspect: suspectReadings(findings, index),
  };
  const reported = run.reported?.k;
  if (!reported) return series;
  const value = Number(reported.value);
  const theirK = convertUnit(value, reported.unit, perTime);
  const theirInInstructor = convertUnit(value, reported.unit, instructor.unit);
  if (theirK === undefined || theirInInstructor === undefined) {
    return { ...series, note: `your k is not drawn: its unit “${prettyUnit(reported.unit)}” could not be read` };
  }
  const hasFinding = findings.some((f) => f.path.startsWith(`runs[${index}]`));
  if (!hasFinding && withinTolerance(settings, theirInInstructor, instructor.value)) return series;
  const intercept = settings.fitModel === 'intercept' && studentPoints ? centredIntercept(theirs, -theirK) : 0;
  return { ...series, theirK, theirLine: { slope: -theirK, intercept } };
}

export function allRunSeries(settings: Settings, runs: SubmittedRun[], refit: Refit, findings: Finding[]): Array<RunSeries | undefined> {
  return refit.runs.map((r, i) => (runs[i] ? runSeries(settings, runs[i], r, i, findings) : undefined));
}
