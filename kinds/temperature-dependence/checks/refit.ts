import type { Point, PointRun, Settings } from '../schemas.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { GAS_CONSTANT, LN_KB_OVER_H } from '../../../server/engine/physical-constants.ts';
import { fitFirstOrderLinear } from '../../../server/engine/first-order-linear.ts';
import { fitFirstOrderNonlinear } from '../../../server/engine/first-order-nonlinear.ts';
import { fitArrhenius, fitEyring, type TemperaturePoint } from '../activation-fits.ts';
import { toKelvin, ZERO_CELSIUS_K } from '../../../server/engine/temperature.ts';
import { convert, parseUnit } from '../../../server/engine/units.ts';
import { convertEstimate } from '../../../server/checks/convert-estimate.ts';
import { fmt } from '../../../server/checks/format.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { InputRejected } from '../../../server/checks/input-rejected.ts';
import { runNotFittedDraft, whyRunNotFitted } from '../../../server/checks/run-not-fitted.ts';
import { implausibleTemperature, implausibleTemperatureDraft, inKelvin } from '../../../server/checks/temperature-plausibility.ts';

/** The four values of the two fits in base units (J mol^-1, s^-1, J mol^-1, J K^-1 mol^-1), and the standard error of E_a. */
export interface Activation {
  Ea: number;
  A: number;
  dH: number;
  dS: number;
  EaSE: number;
}

export interface TemperatureAnalysis {
  points: TemperaturePoint[];
  /** The points given as runs, refitted. */
  runs: RunK[];
  labels: string[];
  /** Where each fitted point is in the submission (a run that gave no k is left out). */
  pointIndex: number[];
  /** The points given as runs that gave no k: left out of our fits. */
  unfitted: UnfittedPoint[];
  Ea: Estimate;
  A: Estimate;
  dH: Estimate;
  dS: Estimate;
  /** The weighted Arrhenius fit's reduced chi-square (undefined for an ordinary fit): how far its points scatter beyond their SEs. */
  reducedChiSquared?: number;
  /** Findings on the data: temperatures outside the plausible range (the refit uses what was probably meant), runs that gave no k. */
  dataNotes: DraftFinding[];
  /** What the same data give with one slip of method each: what a student who made it reports. */
  slips: Partial<Record<string, Array<{ values: Partial<Activation>; detail: string }>>>;
}

// log10(k_B/h) = 10.319, used by mistake where ln(k_B/h) = 23.760 belongs.
const LOG10_KB_OVER_H = LN_KB_OVER_H / Math.LN10;

/** A point given as a run whose readings give no k: where it is, and its temperature in kelvin. */
export interface UnfittedPoint {
  index: number;
  temperature: number;
}

/** A point given as a run: our k in the run's own rate unit, and other right values (the ln F lines). */
export interface RunK {
  index: number;
  k: Estimate;
  alsoRight: number[];
}

// A unit that cannot be read is refused by field; any other failure of a run's fit is a finding on it.
const UNIT_ERRORS = new Set(['unknown-unit', 'unit-kind-mismatch']);

/** Our k for a run, or why its readings give none (a run-not-fitted finding; the point leaves the fit). */
function refitRun(run: PointRun): { k: Estimate; alsoRight: number[] } | { notFitted: string; field: string } {
  const data = { times: run.readings.map((r) => r[0]), readings: run.readings.map((r) => r[1]), timeUnit: run.timeUnit, infinity: run.infinity };
  let exponential;
  try {
    exponential = fitFirstOrderNonlinear(data, { infinity: run.infinity === undefined ? 'fitted' : 'fixed' });
  } catch (error) {
    if (!(error instanceof EngineError) || UNIT_ERRORS.has(error.code)) throw error;
    return { notFitted: whyRunNotFitted(run, error), field: error.field === 'infinity' ? 'infinity' : 'readings' };
  }
  const alsoRight: number[] = [];
  if (run.infinity !== undefined) {
    for (const model of ['origin', 'intercept'] as const) {
      try {
        alsoRight.push(fitFirstOrderLinear({ ...data, infinity: run.infinity }, model).k.value);
      } catch (error) {
        // A reading past x_inf leaves ln F undefined: the exponential fit alone is right then.
        if (!(error instanceof EngineError)) throw error;
      }
    }
  }
  if (!(exponential.k.value > 0)) return { notFitted: `the readings give k = ${fmt(exponential.k.value)}, not a rate constant: check x_inf and the readings`, field: 'readings' };
  return { k: exponential.k, alsoRight };
}

/**
 * A point's temperature in kelvin: as declared, or where that is implausible and the other unit makes
 * it plausible, as probably meant (a warning names it). A temperature at or below absolute zero with
 * no plausible reading is refused by field.
 */
function kelvinOf(p: Point, i: number, notes: DraftFinding[]): number {
  const path = `points[${i}].temperature.value`;
  const found = implausibleTemperature(p.temperature.value, p.temperature.unit);
  if (found) {
    const consequence = found.meant === undefined ? 'It is used as written.' : `The refit uses ${inKelvin(found.meant)} K, and your values are checked against that.`;
    notes.push(implausibleTemperatureDraft(found, `${p.temperature.value} ${p.temperature.unit === 'degC' ? '°C' : 'K'}`, { path, stage: 'arrhenius', what: `point “${p.label}”`, consequence }));
    if (found.meant !== undefined) return found.meant;
  }
  return toKelvin(p.temperature.value, p.temperature.unit, path);
}

/** The finding on a point given as a run whose readings give no k: it leaves the fit, which the rest still makes. */
function unfittedRunDraft(p: Point, path: string, why: string): DraftFinding {
  return runNotFittedDraft({ path, stage: 'runs' }, `The run at ${p.label}`, why, 'Its k is not graded, and the point is left out of the fits of E_a and the rest, which are made from the other points.');
}

/**
 * Every point in kelvin and per second, with where each came from in the submission; a run that gives
 * no k is left out with a finding. A temperature at or below absolute zero, or k not a first-order
 * rate, is refused by field.
 */
function pointsOf(points: Point[], notes: DraftFinding[]): { points: TemperaturePoint[]; runs: RunK[]; pointIndex: number[]; unfitted: UnfittedPoint[] } {
  const runs: RunK[] = [];
  const unfitted: UnfittedPoint[] = [];
  const pointIndex: number[] = [];
  const fitted = points.flatMap((p, i): TemperaturePoint[] => {
    const at = (field: string) => `points[${i}].${field}`;
    try {
      const temperature = kelvinOf(p, i, notes);
      if (p.run) {
        const refit = refitRun(p.run);
        if ('notFitted' in refit) {
          notes.push(unfittedRunDraft(p, at(`run.${refit.field}`), refit.notFitted));
          unfitted.push({ index: i, temperature });
          return [];
        }
        const { k, alsoRight } = refit;
        runs.push({ index: i, k, alsoRight });
        pointIndex.push(i);
        return [{ temperature, k: convert(k.value, k.unit, 's^-1'), standardError: convert(k.standardError, k.unit, 's^-1') }];
      }
      const measured = p.k!;
      parseUnit(measured.unit, 'first-order-rate', at('k.unit'));
      const se = measured.uncertainty === undefined ? undefined : convert(Number(measured.uncertainty), measured.unit, 's^-1');
      pointIndex.push(i);
      return [{ temperature, k: convert(Number(measured.value), measured.unit, 's^-1'), standardError: se }];
    } catch (error) {
      if (error instanceof EngineError) throw new InputRejected([{ path: error.field?.startsWith('points[') ? error.field : at(p.run ? `run.${error.field ?? 'readings'}` : 'k'), message: error.message }]);
      throw error;
    }
  });
  return { points: fitted, runs, pointIndex, unfitted };
}

/** The two fits of these points (per second, kelvin), in base units; undefined where they cannot be made. */
export function activationOf(points: TemperaturePoint[], weighted: boolean): Activation | undefined {
  try {
    const a = fitArrhenius(points, { kUnit: 's^-1', weighted });
    const e = fitEyring(points, { weighted });
    return { Ea: a.Ea.value, A: a.A.value, dH: e.dH.value, dS: e.dS.value, EaSE: a.Ea.standardError };
  } catch (error) {
    // A slip that makes the data unfittable (a temperature of 0 degC in 1/T) is no candidate.
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

/** Where in the submission the fit's complaint about a point (its k, SE or temperature) lies. */
function pointPath(field: string | undefined, input: Point[]): string {
  const m = /^points\[(\d+)\]\.(k|standardError|temperature)$/.exec(field ?? '');
  if (!m) return 'points';
  const i = Number(m[1]);
  // A run's k and SE come from its readings.
  const place = m[2] === 'temperature' ? 'temperature.value' : input[i]?.run ? 'run.readings' : m[2] === 'k' ? 'k.value' : 'k.uncertainty';
  return `points[${i}].${place}`;
}

export function analyseTemperatures(settings: Settings, input: Point[]): TemperatureAnalysis {
  const dataNotes: DraftFinding[] = [];
  const { points, runs, pointIndex, unfitted } = pointsOf(input, dataNotes);
  // With fewer than two points left nothing can be graded: refused, with why each run gave no k.
  if (points.length < 2 && unfitted.length > 0) {
    const whyNot = dataNotes.filter((d) => d.code === 'run-not-fitted').map((d) => ({ path: d.path, message: d.message }));
    throw new InputRejected([...whyNot, { path: 'points', message: `fewer than 2 points give a rate constant (${points.length}), and a line against 1/T needs 2` }]);
  }
  const weighted = settings.fit === 'weighted';
  let arrhenius, eyring;
  try {
    arrhenius = fitArrhenius(points, { kUnit: 's^-1', weighted });
    eyring = fitEyring(points, { weighted });
  } catch (error) {
    if (error instanceof EngineError) throw new InputRejected([{ path: pointPath(error.field, input), message: error.message }]);
    throw error;
  }
  const R = GAS_CONSTANT;
  const ln = arrhenius.line;
  const ey = eyring.line;
  const slips: TemperatureAnalysis['slips'] = {};
  const celsius = activationOf(points.map((p) => ({ ...p, temperature: p.temperature - ZERO_CELSIUS_K })), weighted);
  if (celsius) slips['temperature-scale'] = [{ values: celsius, detail: 'temperatures in °C in 1/T' }];
  slips['log-base'] = [{ values: { A: Math.exp(ln.intercept / Math.LN10), dS: R * (ey.intercept / Math.LN10 - LN_KB_OVER_H) }, detail: 'log10 of k, and its intercept taken as a natural logarithm' }];
  slips['reciprocal-scale'] = [{ values: { Ea: arrhenius.Ea.value / 1000, dH: eyring.dH.value / 1000, EaSE: arrhenius.Ea.standardError / 1000 }, detail: '1000/T read as 1/T' }];
  slips['eyring-form'] = [
    { values: { dH: arrhenius.Ea.value, dS: R * (ln.intercept - LN_KB_OVER_H) }, detail: 'ln k in place of ln(k/T)' },
    { values: { dS: R * (ey.intercept - LOG10_KB_OVER_H) }, detail: 'log10(k_B/h) = 10.319 in place of ln(k_B/h) = 23.760' },
    { values: { dS: R * ey.intercept }, detail: 'ln(k_B/h) left out' },
  ];
  slips['time-unit'] = [
    { values: { dS: eyring.dS.value + R * Math.log(60) }, detail: 'k per minute where per second was needed' },
    { values: { dS: eyring.dS.value - R * Math.log(60) }, detail: 'k per second taken as per minute' },
  ];
  return {
    points,
    runs,
    labels: pointIndex.map((i) => input[i].label),
    pointIndex,
    unfitted,
    Ea: convertEstimate(arrhenius.Ea, settings.units.Ea),
    A: convertEstimate(arrhenius.A, settings.units.A),
    dH: convertEstimate(eyring.dH, settings.units.dH),
    dS: convertEstimate(eyring.dS, settings.units.dS),
    reducedChiSquared: weighted ? ln.reducedChiSquared : undefined,
    dataNotes,
    slips,
  };
}
