import { describe, expect, it } from 'vitest';
import { reactionOrder } from '../../../kinds/reaction-order/checks/kind.ts';
import { Settings, Submission } from '../../../kinds/reaction-order/schemas.ts';
import { signalLine, toConcentration } from '../../../kinds/reaction-order/signal-conversion.ts';
import { checkSubmission } from '../../../server/checks/check.ts';

const settingsOf = (signal: unknown) => Settings.parse({ kind: 'reaction-order', signal });
const issuesOf = (signal: unknown) => reactionOrder.settingsIssues(settingsOf(signal)).map((i) => i.path);

describe('signal to concentration', () => {
  // Hand-worked: Beer-Lambert [A] = (A - A_inf)/(epsilon l) = (0.5 - 0.1)/(1.0e4 x 0.5) = 8.0e-5 M; 1 m^2 mol^-1 = 10 M^-1 cm^-1 (1 L = 1 dm^3).
  it('absorbance by the Beer-Lambert law, A_inf subtracted, epsilon and l in any unit', () => {
    const line = signalLine(settingsOf({ type: 'absorbance', molarAbsorptivity: { value: 1000, unit: 'm^2 mol^-1' }, pathLength: { value: 5, unit: 'mm' }, endAbsorbance: 0.1 }).signal);
    expect(toConcentration(line, 0.5)).toBeCloseTo(8.0e-5, 15);
  });

  // Hand-worked: [A] = (G - intercept)/slope = (2.2 - 0.2) mS / (0.2 mS mM^-1 = 200 mS M^-1) = 0.0100 M.
  it('conductance by its calibration line, the slope per mM read per M', () => {
    const line = signalLine(settingsOf({ type: 'conductance', unit: 'mS', calibration: { slope: { value: 0.2, unit: 'mS/mM' }, intercept: { value: 0.2, unit: 'mS' } } }).signal);
    expect(toConcentration(line, 2.2)).toBeCloseTo(0.01, 15);
  });

  it('concentrations in mM read as M (1 mM = 1e-3 M)', () => {
    expect(toConcentration(signalLine(settingsOf({ type: 'concentration', unit: 'mM' }).signal), 25)).toBeCloseTo(0.025, 15);
  });
});

describe('settings and submissions refused, naming the field', () => {
  it('a unit of the wrong kind in the signal', () => {
    expect(issuesOf({ type: 'absorbance', molarAbsorptivity: { value: 1e4, unit: 'M^-1 s^-1' }, pathLength: { value: 1, unit: 'min' } })).toEqual(['signal.molarAbsorptivity.unit', 'signal.pathLength.unit']);
    expect(issuesOf({ type: 'concentration', unit: 'cm' })).toEqual(['signal.unit']);
  });

  it('a calibration whose units do not go with the conductance', () => {
    expect(issuesOf({ type: 'conductance', unit: 'mS', calibration: { slope: { value: 2, unit: 'uS M^-1' }, intercept: { value: 0.1, unit: 'uS' } } })).toEqual(['signal.calibration.slope.unit', 'signal.calibration.intercept.unit']);
  });

  it('a signal of no known type, and a zero absorptivity', () => {
    const paths = (input: unknown) => (Settings.safeParse(input).error?.issues ?? []).map((i) => i.path.join('.'));
    expect(paths({ kind: 'reaction-order', signal: { type: 'rotation' } })).toEqual(['signal.type']);
    expect(paths({ kind: 'reaction-order', signal: { type: 'absorbance', molarAbsorptivity: { value: 0, unit: 'M^-1 cm^-1' }, pathLength: { value: 1, unit: 'cm' } } })).toEqual(['signal.molarAbsorptivity.value']);
  });

  it('an order other than 0, 1 or 2, and a run time unit that is not a time (rejected, not a crash)', () => {
    const paths = (input: unknown) => (Submission.safeParse(input).error?.issues ?? []).map((i) => i.path.join('.'));
    const runs = [{ label: 'a', timeUnit: 'min', readings: [[0, 1], [1, 0.5], [2, 0.25]] }];
    expect(paths({ studentId: 'S-1', runs, reported: { order: 3, k: { value: 1, unit: 'min^-1' } } })).toEqual(['reported.order']);
    const result = checkSubmission({ kind: reactionOrder, settings: settingsOf({ type: 'concentration', unit: 'M' }) }, { studentId: 'S-1', runs: [{ ...runs[0], timeUnit: 'M' }], reported: { order: 1, k: { value: 0.69, unit: 'min^-1' } } });
    expect(result.status).toBe('rejected');
    expect(result.rejected).toEqual([expect.objectContaining({ path: 'runs[0].timeUnit' })]);
  });
});
