import { EngineError } from '../engine/engine-error.ts';
import { fitFirstOrderNonlinear } from '../engine/first-order-nonlinear.ts';
import { decimalsOf, oneSlipCopies, type SlipKind } from './digit-slips.ts';

/**
 * Readings far off the curve through the others, on a student's own data (no class table to copy
 * from). A reading is suspect when it lies more than SUSPECT_SDS residual standard deviations, and
 * more than MIN_OFFSET_STEPS display steps, from the curve fitted without it; the floor keeps the
 * last-digit scatter of a reading from ever being called a slip.
 */
const SUSPECT_SDS = 6;
const MIN_OFFSET_STEPS = 10;

export interface SuspectReading {
  index: number;
  reading: number;
  /** The curve's value at that time, fitted without the reading. */
  predicted: number;
  /** A one-slip copy of the reading that lies on the curve, if one does. */
  intended?: { value: number; slip: SlipKind };
}

const undo: Record<SlipKind, SlipKind> = {
  'sign-lost': 'sign-lost',
  'decimal-point': 'decimal-point',
  'transposed-digits': 'transposed-digits',
  'dropped-digit': 'extra-digit',
  'extra-digit': 'dropped-digit',
};

interface Curve {
  times: number[];
  readings: number[];
  timeUnit: string;
}

function fitWithout(curve: Curve, skip: number) {
  const times = curve.times.filter((_, i) => i !== skip);
  const readings = curve.readings.filter((_, i) => i !== skip);
  return fitFirstOrderNonlinear({ times, readings, timeUnit: curve.timeUnit }, { infinity: 'fitted' });
}

function predictAt(fit: ReturnType<typeof fitFirstOrderNonlinear>, elapsed: number): number {
  return fit.infinity.value + (fit.x0.value - fit.infinity.value) * Math.exp(-fit.k.value * elapsed);
}

export function findSuspectReading(curve: Curve): SuspectReading | undefined {
  const n = curve.readings.length;
  if (n < 6) return undefined;
  try {
    const all = fitFirstOrderNonlinear({ ...curve }, { infinity: 'fitted' });
    let worst = 0;
    for (let i = 1; i < n; i++) if (Math.abs(all.residuals[i]) > Math.abs(all.residuals[worst])) worst = i;
    const without = fitWithout(curve, worst);
    // Times count from the first reading; without reading 0 they count from reading 1.
    const origin = worst === 0 ? curve.times[1] : curve.times[0];
    const predicted = predictAt(without, curve.times[worst] - origin);
    const reading = curve.readings[worst];
    const decimals = curve.readings.reduce((d, x) => Math.max(d, decimalsOf(x)), 0);
    const step = 10 ** -decimals;
    const offset = Math.abs(reading - predicted);
    if (offset <= SUSPECT_SDS * without.residualSD || offset <= MIN_OFFSET_STEPS * step) return undefined;
    // The intended value was written to the run's precision; a slip that added a digit is undone by
    // dropping one, and the reverse.
    const nearest = oneSlipCopies(reading, decimals)
      .filter((s) => decimalsOf(s.value) <= decimals)
      .map((s) => ({ ...s, kind: undo[s.kind], off: Math.abs(s.value - predicted) }))
      .sort((a, b) => a.off - b.off)[0];
    const onCurve = nearest && nearest.off <= Math.max(4 * without.residualSD, 3 * step);
    return {
      index: worst,
      reading,
      predicted,
      intended: onCurve ? { value: nearest.value, slip: nearest.kind } : undefined,
    };
  } catch (error) {
    // Data the exponential cannot describe say nothing about single readings.
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}
