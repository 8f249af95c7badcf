import type { Rejection } from '../../../schemas/result.ts';
import { unitIssues } from '../../../server/checks/unit-issues.ts';
import type { Settings } from '../schemas.ts';
import { perConcentrationFactor } from '../signal-conversion.ts';

/** Every unit in the signal must parse and be of the kind its place needs; a calibration's units must go with the conductance's. */
export function settingsIssues(settings: Settings): Rejection[] {
  const signal = settings.signal;
  if (signal.type === 'concentration') return unitIssues([['signal.unit', signal.unit, 'concentration']]);
  if (signal.type === 'absorbance') {
    return unitIssues([
      ['signal.molarAbsorptivity.unit', signal.molarAbsorptivity.unit, 'molar-absorptivity'],
      ['signal.pathLength.unit', signal.pathLength.unit, 'length'],
    ]);
  }
  const issues: Rejection[] = [];
  const { slope, intercept } = signal.calibration;
  if (perConcentrationFactor(slope.unit, signal.unit) === undefined) {
    issues.push({ path: 'signal.calibration.slope.unit', message: `"${slope.unit}" is not ${signal.unit} per a concentration (such as ${signal.unit} M^-1)` });
  }
  if (intercept.unit.trim() !== signal.unit.trim()) {
    issues.push({ path: 'signal.calibration.intercept.unit', message: `the intercept is a conductance in the signal's unit, ${signal.unit}, not "${intercept.unit}"` });
  }
  return issues;
}
