import type { SubmittedRun } from '../schemas.ts';
import type { LineModel } from '../../../server/engine/linear-fit.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { fitTransformed, type FirstOrderLinearFit } from '../../../server/engine/first-order-linear.ts';
import { fitFirstOrderNonlinear, type FirstOrderNonlinearFit } from '../../../server/engine/first-order-nonlinear.ts';
import { elapsedTimes, firstOrderTransform, type FirstOrderRun, type FirstOrderTransform } from '../../../server/engine/first-order-run.ts';
import { fitGuggenheim } from '../../../server/engine/guggenheim.ts';
import { convert, parseUnit, type Unit } from '../../../server/engine/units.ts';
import { fmt } from '../../../server/checks/format.ts';
import { InputRejected } from '../../../server/checks/input-rejected.ts';
import { whyRunNotFitted } from '../../../server/checks/run-not-fitted.ts';
import { molarForNormality } from './catalyst-unit.ts';

/** A run whose data give no fit at all: a finding on the run, and the rest of the submission is graded. */
export interface UnfittedRun {
  index: number;
  path: string;
  label: string;
  timeUnit: Unit;
  concentrationM: number;
  notFitted: { path: string; message: string };
}

export type RunOutcome = RunAnalysis | UnfittedRun;

export const isFitted = (a: RunOutcome): a is RunAnalysis => !('notFitted' in a);

/** Our own analysis of one run, from the student's raw data as submitted. */
export interface RunAnalysis {
  index: number;
  path: string;
  label: string;
  timeUnit: Unit;
  concentrationM: number;
  times: number[];
  readings: number[];
  infinity?: number;
  /** ln F with the student's x_inf, one entry per reading (NaN where excluded); absent without x_inf. */
  transform?: FirstOrderTransform;
  /** Readings on the wrong side of x_inf: ln F is undefined there, so the fits leave them out. */
  excluded: number[];
  /** The model the assignment asks for, and the other one. */
  asked?: FirstOrderLinearFit;
  other?: FirstOrderLinearFit;
  /** The exponential fit with x_inf fixed; absent if it cannot converge on these data. */
  exponential?: FirstOrderNonlinearFit;
  /**
   * The exponential fit with x_inf fitted too, the end value the readings themselves imply: the same
   * as `exponential` for a run without x_inf; absent if it cannot converge.
   */
  ownEndValue?: FirstOrderNonlinearFit;
  /** The k the student should report, per the run's time unit: the asked model, or without x_inf the exponential fit. */
  expected: Estimate;
  /** Other values that are right too (the Guggenheim k for a run without x_inf). */
  alsoRight: Estimate[];
  /**
   * Why these data give no rate constant to grade against, when they do not: x_inf on the side the
   * readings move away from (k comes out negative), or a run whose k is not told apart from zero.
   */
  undetermined?: { path: string; message: string };
}

/** A negative k, or one whose interval reaches zero without x_inf, is no value to mark a student against. */
function undeterminedK(path: string, readings: number[], infinity: number | undefined, expected: Estimate): RunAnalysis['undetermined'] {
  const first = readings[0];
  const last = readings[readings.length - 1];
  if (infinity !== undefined && !(expected.value > 0)) {
    return {
      path: `${path}.infinity`,
      message:
        `x_inf = ${fmt(infinity)} lies on the side the readings move away from: they go from ${fmt(first)} towards ${fmt(last)}, ` +
        `so with it the rate constant comes out as ${fmt(expected.value)}, and a rate constant cannot be negative. ` +
        'Please check x_inf: its value, its sign, and whether it belongs to this run. k_obs is not graded for this run.',
    };
  }
  if (infinity === undefined && !(expected.ci95[0] > 0)) {
    return {
      path: `${path}.readings`,
      message:
        `These readings do not determine k_obs: the fit gives ${fmt(expected.value)} ± ${fmt(expected.standardError)}, and its 95 % interval reaches zero. ` +
        'The run may be too short or too noisy for the change it shows, and without x_inf nothing else fixes k. k_obs is not graded for this run.',
    };
  }
  return undefined;
}

/** Where in the submission an engine error's field (`readings[3]`, `times[2]`, `infinity`) lies. */
function placeOf(runPath: string, error: EngineError): string {
  const field = error.field ?? '';
  const m = /^(readings|times)\[(\d+)\]$/.exec(field);
  return m ? `${runPath}.readings[${m[2]}][${m[1] === 'times' ? 0 : 1}]` : `${runPath}.${field === 'infinity' ? 'infinity' : 'readings'}`;
}

/** Why a run's data give no fit, in words a student can act on; too few readings for the ln F line is this kind's own. */
function whyNotFitted(run: SubmittedRun, error: EngineError): string {
  if (error.code === 'too-few-points' && run.infinity !== undefined) return `fewer than 3 of its readings lie on x_0's side of x_inf = ${fmt(run.infinity)}, and ln F needs 3 to fit a line (${error.message})`;
  return whyRunNotFitted(run, error);
}

function parseAt<T>(path: string, parse: () => T): T {
  try {
    return parse();
  } catch (error) {
    if (error instanceof EngineError) throw new InputRejected([{ path, message: error.message }]);
    throw error;
  }
}

/** The exponential fit is shown beside the asked one, never needed to grade: a failure leaves it out. */
/** Only a signal for review rests on this fit, so a run too short or too flat for it simply has none. */
function ownEndValueFit(data: FirstOrderRun, initialK: number): FirstOrderNonlinearFit | undefined {
  try {
    return fitFirstOrderNonlinear(data, { infinity: 'fitted', initialK });
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

function exponentialOrNothing(fit: () => FirstOrderNonlinearFit): FirstOrderNonlinearFit | undefined {
  try {
    return fit();
  } catch (error) {
    if (error instanceof EngineError && error.code === 'no-convergence') return undefined;
    throw error;
  }
}

function guggenheimOrNothing(data: FirstOrderRun): Estimate[] {
  try {
    return [fitGuggenheim(data).k];
  } catch (error) {
    if (error instanceof EngineError) return [];
    throw error;
  }
}

/**
 * ln F for the readings on x_0's side of x_inf, and the full column with NaN for the others: a
 * mis-copied reading past x_inf is a finding about that reading, not a reason to refuse the run.
 */
function transformDefined(run: FirstOrderRun, infinity: number) {
  const span = run.readings[0] - infinity;
  if (span === 0) throw new EngineError('non-positive-ratio', `x_inf = ${infinity} equals the first reading x_0, so F is undefined`, 'infinity');
  const keep: number[] = [];
  const excluded: number[] = [];
  for (let i = 0; i < run.readings.length; i++) ((run.readings[i] - infinity) / span > 0 ? keep : excluded).push(i);
  // Nearly always every reading is on x_0's side: the column is the defined one.
  if (excluded.length === 0) {
    const transform = firstOrderTransform(run, infinity);
    return { transform, defined: transform, excluded };
  }
  const defined = firstOrderTransform(
    { ...run, times: keep.map((i) => run.times[i]), readings: keep.map((i) => run.readings[i]) },
    infinity,
  );
  const t = elapsedTimes(run);
  const transform: FirstOrderTransform = { t, F: t.map(() => Number.NaN), lnF: t.map(() => Number.NaN) };
  keep.forEach((i, j) => {
    transform.F[i] = defined.F[j];
    transform.lnF[i] = defined.lnF[j];
  });
  return { transform, defined, excluded };
}

/**
 * Our analysis of one run; a run its data cannot be fitted for (too few readings, readings that do
 * not change, x_inf equal to x_0, a fit that does not converge) comes back as unfitted with the
 * reason. A unit that cannot be read is refused by field.
 */
export function analyseRun(run: SubmittedRun, index: number, model: LineModel): RunOutcome {
  const path = `runs[${index}]`;
  const timeUnit = parseAt(`${path}.timeUnit`, () => parseUnit(run.timeUnit, 'time'));
  const catalystUnit = molarForNormality(run.catalyst.unit) ?? run.catalyst.unit;
  const concentrationM = parseAt(`${path}.catalyst.unit`, () => convert(run.catalyst.value, parseUnit(catalystUnit, 'concentration'), 'M'));
  const times = run.readings.map((r) => r[0]);
  const readings = run.readings.map((r) => r[1]);
  const data = { times, readings, timeUnit: run.timeUnit, infinity: run.infinity };
  const unfitted = (at: string, why: string): UnfittedRun => ({ index, path, label: run.label, timeUnit, concentrationM, notFitted: { path: at, message: why } });
  if (readings.every((x) => x === readings[0])) return unfitted(`${path}.readings`, 'its readings do not change, so no rate can be fitted');
  try {
    if (run.infinity === undefined) {
      const exponential = fitFirstOrderNonlinear(data, { infinity: 'fitted' });
      // Guggenheim's method needs readings at a constant interval apart: where it cannot be applied it is
      // simply not offered as another right answer; the run is still graded against the fit.
      const alsoRight = guggenheimOrNothing(data);
      const undetermined = undeterminedK(path, readings, undefined, exponential.k);
      return { index, path, label: run.label, timeUnit, concentrationM, times, readings, excluded: [], exponential, ownEndValue: exponential, expected: exponential.k, alsoRight, undetermined };
    }
    const { transform, defined, excluded } = transformDefined(data, run.infinity);
    const asked = fitTransformed(defined, run.timeUnit, model);
    const other = fitTransformed(defined, run.timeUnit, model === 'origin' ? 'intercept' : 'origin');
    const withIntercept = model === 'intercept' ? asked : other;
    const exponential = exponentialOrNothing(() => fitFirstOrderNonlinear(data, { infinity: 'fixed', initialK: withIntercept.k.value }));
    return {
      index,
      path,
      label: run.label,
      timeUnit,
      concentrationM,
      times,
      readings,
      infinity: run.infinity,
      transform,
      excluded,
      asked,
      other,
      exponential,
      ownEndValue: ownEndValueFit(data, withIntercept.k.value),
      expected: asked.k,
      alsoRight: [],
      undetermined: undeterminedK(path, readings, run.infinity, asked.k),
    };
  } catch (error) {
    if (error instanceof EngineError) return unfitted(placeOf(path, error), whyNotFitted(run, error));
    throw error;
  }
}
