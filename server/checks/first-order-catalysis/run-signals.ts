import type { Settings } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { Signal } from '../../../schemas/result.ts';
import { fmt } from '../format.ts';
import type { RunAnalysis } from './run-analysis.ts';

/**
 * Signals about how a run was measured, for the TA's review (never points):
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

export function runSignals(a: RunAnalysis, settings: Settings): Signal[] {
  const out: Signal[] = [];
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
