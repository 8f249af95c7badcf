import { EngineError } from '../../server/engine/engine-error.ts';
import { convert, parseUnit } from '../../server/engine/units.ts';
import type { Signal } from './schemas.ts';

/**
 * Every signal this kind reads is linear in the concentration: signal = offset + perMolar [A].
 * Concentration: a unit's factor; absorbance: A = A_inf + epsilon l [A] (Beer-Lambert, with epsilon in
 * M^-1 cm^-1 and l in cm); conductance: G = intercept + slope [A] by the calibration.
 */
export interface SignalLine {
  offset: number;
  perMolar: number;
}

/** A calibration slope's unit: the signal's unit per a concentration (mS M^-1, mS/mM, mS L mol^-1). Its factor to per M, or undefined. */
export function perConcentrationFactor(slopeUnit: string, signalUnit: string): number | undefined {
  const text = slopeUnit.trim();
  if (!text.startsWith(signalUnit.trim())) return undefined;
  const rest = text.slice(signalUnit.trim().length).trim();
  try {
    // "/mM" is a concentration below the line; "M^-1" or "L mol^-1" a reciprocal one, read beside s^-1 as a second-order rate unit.
    if (rest.startsWith('/')) return 1 / parseUnit(rest.slice(1), 'concentration').factor;
    return parseUnit(`${rest} s^-1`, 'second-order-rate').factor;
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

export function signalLine(signal: Signal): SignalLine {
  if (signal.type === 'concentration') return { offset: 0, perMolar: convert(1, 'M', signal.unit) };
  if (signal.type === 'absorbance') {
    const epsilon = convert(signal.molarAbsorptivity.value, signal.molarAbsorptivity.unit, 'M^-1 cm^-1');
    const path = convert(signal.pathLength.value, signal.pathLength.unit, 'cm');
    return { offset: signal.endAbsorbance ?? 0, perMolar: epsilon * path };
  }
  const { slope, intercept } = signal.calibration;
  const factor = perConcentrationFactor(slope.unit, signal.unit);
  if (factor === undefined) throw new EngineError('unknown-unit', `"${slope.unit}" is not ${signal.unit} per a concentration`, 'signal.calibration.slope.unit');
  return { offset: intercept.value, perMolar: slope.value * factor };
}

export const toConcentration = (line: SignalLine, signal: number): number => (signal - line.offset) / line.perMolar;

