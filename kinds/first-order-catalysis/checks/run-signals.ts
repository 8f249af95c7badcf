import type { Settings, SubmittedRun } from '../schemas.ts';
import type { Signal } from '../../../schemas/result.ts';
import { durbinWatsonBelow } from '../../../server/engine/durbin-watson.ts';
import { tCriticalTwoSided, tTwoSidedP } from '../../../server/engine/student-t.ts';
import { fmt } from '../../../server/checks/format.ts';
import type { RunAnalysis } from './run-analysis.ts';

/**
 * Signals about how a run was measured, for the TA's review (never points). Per run:
 * - `small-change`: the readings move fewer than SMALL_CHANGE_STEPS display steps over the run and k
 *   is uncertain by more than SMALL_CHANGE_SHARE (a late start, a dilute solution, or a short run):
 *   the change, not the instrument's scatter, limits what the run can tell;
 * - `over-resolution`: readings written with more decimals than the instrument displays (the
 *   assignment's `displayStep`), as a computed or transformed value would be.
 */
export const SMALL_CHANGE_SHARE = 0.05;
export const SMALL_CHANGE_STEPS = 200;

/** Whether x is a whole number of display steps (to a millionth of a step, beyond binary rounding). */
function onStep(x: number, step: number): boolean {
  const n = x / step;
  return Math.abs(n - Math.round(n)) <= 1e-6 + 1e-12 * Math.abs(n);
}

/**
 * `residual-pattern`: the residuals of the exponential fit with x_inf fitted run in a pattern rather
 * than scatter, judged by the Durbin-Watson statistic for this run's own fit. Independent scatter gives
 * so small a statistic with probability under PATTERN_P (about 1 run in 10,000 on honest generated
 * runs).
 */
export const PATTERN_P = 1e-4;

function residualPattern(a: RunAnalysis): Signal | undefined {
  const fit = a.ownEndValue;
  if (!fit || fit.dof < 3) return undefined;
  const dw = durbinWatsonBelow(PATTERN_P, fit.residuals, fit.jacobian, fit.normalInverse);
  if (!dw || !(dw.pValue < PATTERN_P)) return undefined;
  return {
    code: 'residual-pattern',
    path: `${a.path}.readings`,
    message: `The readings of run "${a.label}" lie on one side of the exponential curve for several minutes at a time rather than scattering about it (Durbin-Watson statistic ${fmt(dw.statistic)}, where independent scatter gives about ${fmt(dw.expected)}; one run in ${fmt(Math.round(1 / dw.pValue))} would show so strong a pattern by chance). An instrument still warming up or drifting, readings taken at other times than written, or a reaction that is not first order could explain it. Worth a look, not a finding.`,
    evidence: { durbinWatson: dw.statistic, expected: dw.expected, pValue: dw.pValue },
  };
}

/**
 * `end-value`: the end value the readings imply (x_inf fitted with k) and the recorded x_inf differ by
 * more than their uncertainties allow (two-sided p under END_VALUE_P, from the fitted value's standard
 * error and the scatter of one reading), and the difference moves k by more than END_VALUE_K_SHARE,
 * so it matters to the result. Judged only where the readings alone fix k to END_VALUE_OWN_K_SHARE.
 * A constant zero offset of the instrument cancels in F and cannot cause it.
 */
export const END_VALUE_P = 1e-3;
export const END_VALUE_K_SHARE = 0.01;
/** Where the readings alone do not fix k this well, they do not say where they level off either. */
export const END_VALUE_OWN_K_SHARE = 0.2;
// Inside this share below the critical value p is surely not under END_VALUE_P, whatever rounding the
// quantile and the distribution function carry.
export const END_VALUE_SCREEN_MARGIN = 1e-9;

function endValue(a: RunAnalysis): Signal | undefined {
  const own = a.ownEndValue;
  const recorded = a.infinity;
  if (!own || !a.exponential || recorded === undefined || own.dof < 2) return undefined;
  if (!(own.k.value > 0 && own.k.standardError < END_VALUE_OWN_K_SHARE * own.k.value)) return undefined;
  const fitted = own.infinity;
  const kShare = Math.abs(a.exponential.k.value - own.k.value) / own.k.value;
  if (!(kShare > END_VALUE_K_SHARE)) return undefined;
  const t = (fitted.value - recorded) / Math.hypot(fitted.standardError, own.residualSD);
  // Inside Student's critical value for END_VALUE_P p is above it: only a run past it needs p itself.
  if (!(Math.abs(t) >= tCriticalTwoSided(END_VALUE_P, own.dof) * (1 - END_VALUE_SCREEN_MARGIN))) return undefined;
  const p = tTwoSidedP(t, own.dof);
  if (!(p < END_VALUE_P)) return undefined;
  const unit = a.exponential.k.unit;
  return {
    code: 'end-value',
    path: `${a.path}.infinity`,
    message: `The readings of run "${a.label}" level off towards ${fmt(fitted.value)} ± ${fmt(fitted.standardError)} (their own exponential fit), but the recorded end value is ${fmt(recorded)}. With the recorded value k is ${fmt(a.exponential.k.value)} ${unit}, with the readings' own ${fmt(own.k.value)} ${unit}, ${fmt(100 * kShare)} % apart. An end value read before equilibrium or misread, or an instrument that drifted during the run, could explain it; a constant zero offset could not, since it shifts the readings and the end value alike and cancels in F. Worth a look, not a finding.`,
    evidence: { recordedEndValue: recorded, readingsEndValue: fitted.value, readingsEndValueSE: fitted.standardError, pValue: p, kWithRecorded: a.exponential.k.value, kWithReadings: own.k.value },
  };
}

export function runSignals(a: RunAnalysis, settings: Settings): Signal[] {
  const out: Signal[] = [];
  for (const signal of [residualPattern(a), endValue(a)]) if (signal) out.push(signal);
  const step = settings.displayStep;
  const offStep = a.readings.filter((x) => !onStep(x, step)).length;
  if (offStep > 0) {
    out.push({
      code: 'over-resolution',
      path: `${a.path}.readings`,
      message: `${offStep} of the ${a.readings.length} readings of run "${a.label}" are written more finely than the instrument displays (${fmt(step)}). Readings are usually copied as displayed; finer values may have been computed or converted. Worth a look, not a finding.`,
      evidence: { readingsOffStep: offStep, readings: a.readings.length, displayStep: step },
    });
  }
  const fit = a.exponential;
  const change = Math.abs(a.readings[0] - a.readings[a.readings.length - 1]);
  if (fit && fit.k.value > 0 && change < SMALL_CHANGE_STEPS * step) {
    const relative = fit.k.standardError / fit.k.value;
    if (relative > SMALL_CHANGE_SHARE) {
      out.push({
        code: 'small-change',
        path: `${a.path}.readings`,
        message: `The readings of run "${a.label}" change by ${fmt(change)} over the run, only ${fmt(change / step)} display steps, and k is uncertain by about ${fmt(100 * relative)} %. A late start, a dilute solution or a short run could explain it. Worth a look, not a finding.`,
        evidence: { change, displaySteps: change / step, relativeStandardError: relative },
      });
    }
  }
  return out;
}

/**
 * The runs of one experiment at one temperature: `temperature-spread` when the recorded temperatures
 * (temperatureC) lie further apart than the assignment allows (1 degC by default; rate constants of
 * activated processes change by several per cent per degree), `temperature-missing` when the
 * assignment asks each run to record one and some do not.
 */
export function temperatureSignals(runs: SubmittedRun[], settings: Settings): Signal[] {
  const recorded = runs.map((r, i) => ({ i, t: r.temperatureC })).filter((r): r is { i: number; t: number } => r.t !== undefined);
  const out: Signal[] = [];
  if (recorded.length >= 2) {
    const low = recorded.reduce((a, b) => (b.t < a.t ? b : a));
    const high = recorded.reduce((a, b) => (b.t > a.t ? b : a));
    const spread = high.t - low.t;
    if (spread > settings.temperature.maxSpread) {
      out.push({
        code: 'temperature-spread',
        path: 'runs',
        message: `The runs were recorded at temperatures ${fmt(spread)} degC apart (run "${runs[low.i].label}" at ${fmt(low.t)} degC, run "${runs[high.i].label}" at ${fmt(high.t)} degC), more than the ${fmt(settings.temperature.maxSpread)} degC the assignment allows; their rate constants may differ for that reason as well as the catalyst. Worth a look, not a finding.`,
        evidence: { spread, maxSpread: settings.temperature.maxSpread, lowest: low.t, highest: high.t },
      });
    }
  }
  const missing = runs.length - recorded.length;
  if (settings.temperature.required && missing > 0) {
    out.push({
      code: 'temperature-missing',
      path: 'runs',
      message: `${missing} of the ${runs.length} runs record no temperature, which the assignment asks for. Worth a look, not a finding.`,
      evidence: { missing, runs: runs.length },
    });
  }
  return out;
}

// With the last displayed digit uniform over 0-9, as honest scatter of a few display steps makes it,
// 40 readings use at most 5 distinct last digits with probability about C(10,5) (1/2)^40 < 3e-10.
export const DIGIT_MIN_READINGS = 40;
export const DIGIT_MAX_USED = 5;

/**
 * `digit-preference`: across a submission's readings, the last displayed digit takes at most five of
 * its ten values (only even digits, only 0 and 5): readings rounded more coarsely than displayed, or
 * written by preference. Judged only for a display step that is a power of ten.
 */
export function digitSignals(analyses: RunAnalysis[], settings: Settings): Signal[] {
  const step = settings.displayStep;
  const places = -Math.log10(step);
  if (Math.abs(places - Math.round(places)) > 1e-9) return [];
  // Which last digits occur, as bits 0-9: every reading of every submission passes here.
  let seen = 0;
  let readings = 0;
  for (const a of analyses) {
    for (const x of a.readings) seen |= 1 << (((Math.round(Math.abs(x) / step) % 10) + 10) % 10);
    readings += a.readings.length;
  }
  if (readings < DIGIT_MIN_READINGS) return [];
  const used = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => seen & (1 << d));
  if (used.length > DIGIT_MAX_USED) return [];
  return [
    {
      code: 'digit-preference',
      path: 'runs',
      message: `Of ${readings} readings, the last displayed digit (the ${fmt(step)} place) is only ever ${used.join(', ')}; honest scatter of a few display steps uses all ten about equally. Readings rounded more coarsely than the instrument displays, or written by preference, would look like this. Worth a look, not a finding.`,
      evidence: { readings, digitsUsed: used.length },
    },
  ];
}
