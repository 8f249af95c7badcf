import { EngineError } from '../engine/engine-error.ts';
import { fitFirstOrderNonlinear } from '../engine/first-order-nonlinear.ts';
import { displayStepOf } from './display-step.ts';

/**
 * Runs smoother than an instrument reads: the scatter of the readings about the exponential curve
 * (x_inf fitted) is no larger than rounding to the display step alone gives (a uniform rounding error
 * has SD step/sqrt(12), about 0.29 step), while the section's own runs (their median) or the
 * instrument, by its stated noise where the assignment gives one, scatter several times more. A
 * sign that readings were computed from a curve rather than read; a prompt for review, never a finding.
 */
export const SMOOTH_STEPS = 0.5;
export const SECTION_FACTOR = 3;

export interface RunsOfStudent {
  studentId: string;
  runs: Array<{ label: string; timeUnit: string; readings: Array<[number, number]> }>;
}

export interface SmoothRun {
  studentId: string;
  run: number;
  label: string;
  residualSD: number;
  step: number;
  sectionMedianSD: number;
  /** The assignment's stated noise of one reading, where it gives one. */
  instrumentNoise?: number;
}

function scatterOf(run: RunsOfStudent['runs'][number]): { residualSD: number; step: number } | undefined {
  const times = run.readings.map((r) => Number(r[0]));
  const readings = run.readings.map((r) => Number(r[1]));
  if (readings.length < 6) return undefined;
  try {
    const fit = fitFirstOrderNonlinear({ times, readings, timeUnit: run.timeUnit }, { infinity: 'fitted' });
    return { residualSD: fit.residualSD, step: displayStepOf(readings) };
  } catch (error) {
    // A run the curve does not fit says nothing about smoothness.
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

/** A run's scatter about its curve, with what a signal names it by; a student's runs are measured as they come. */
export interface RunScatter {
  studentId: string;
  run: number;
  label: string;
  scatter: { residualSD: number; step: number } | undefined;
}

export function runScatters(student: RunsOfStudent): RunScatter[] {
  return student.runs.map((run, i) => ({ studentId: student.studentId, run: i, label: run.label, scatter: scatterOf(run) }));
}

export function findSmoothRuns(section: RunsOfStudent[], instrumentNoise?: number): SmoothRun[] {
  return smoothAmong(section.flatMap(runScatters), instrumentNoise);
}

/** The runs smoother than the instrument among the section's runs (each student's, in order), against their median. */
export function smoothAmong(all: RunScatter[], instrumentNoise?: number): SmoothRun[] {
  const sds = all.flatMap((r) => (r.scatter ? [r.scatter.residualSD] : [])).sort((a, b) => a - b);
  if (sds.length === 0) return [];
  const median = sds[Math.floor(sds.length / 2)];
  const expected = Math.max(median, instrumentNoise ?? 0);
  return all.flatMap((r) =>
    r.scatter && r.scatter.residualSD <= SMOOTH_STEPS * r.scatter.step && expected >= SECTION_FACTOR * Math.max(r.scatter.residualSD, (0.5 * r.scatter.step) / Math.sqrt(3))
      ? [{ studentId: r.studentId, run: r.run, label: r.label, residualSD: r.scatter.residualSD, step: r.scatter.step, sectionMedianSD: median, ...(instrumentNoise === undefined ? {} : { instrumentNoise }) }]
      : [],
  );
}
