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
  /** Decimal places the run's readings are written to. */
  decimals: number;
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

/** The curve without reading `skip`, started from the rate of the fit of all where there is one. */
function fitWithout(curve: Curve, skip: number, initialK?: number) {
  const times = curve.times.filter((_, i) => i !== skip);
  const readings = curve.readings.filter((_, i) => i !== skip);
  return fitFirstOrderNonlinear({ times, readings, timeUnit: curve.timeUnit }, { infinity: 'fitted', initialK });
}

/**
 * The reading whose removal leaves the tightest curve. Only the three worst-fitting readings of a fit
 * of all are tried; when one reading is so far off that no fit of all converges, every reading is.
 */
function mostSuspect(curve: Curve) {
  let tried = curve.readings.map((_, i) => i);
  let initialK: number | undefined;
  try {
    const all = fitFirstOrderNonlinear({ ...curve }, { infinity: 'fitted' });
    tried = tried.sort((a, b) => Math.abs(all.residuals[b]) - Math.abs(all.residuals[a])).slice(0, 3);
    initialK = all.k.value;
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
  }
  let best: { index: number; fit: ReturnType<typeof fitWithout> } | undefined;
  for (const i of tried) {
    try {
      const fit = fitWithout(curve, i, initialK);
      if (!best || fit.residualSD < best.fit.residualSD) best = { index: i, fit };
    } catch (error) {
      if (!(error instanceof EngineError)) throw error;
    }
  }
  return best;
}

export function findSuspectReading(curve: Curve): SuspectReading | undefined {
  const n = curve.readings.length;
  if (n < 6) return undefined;
  const best = mostSuspect(curve);
  if (!best) return undefined;
  const { index, fit } = best;
  // Times count from the first reading; without reading 0 they count from reading 1.
  const origin = index === 0 ? curve.times[1] : curve.times[0];
  const predicted = fit.infinity.value + (fit.x0.value - fit.infinity.value) * Math.exp(-fit.k.value * (curve.times[index] - origin));
  const reading = curve.readings[index];
  const offset = Math.abs(reading - predicted);
  // The cheap test first: the display step is needed only for a reading far off by the scatter.
  if (offset <= SUSPECT_SDS * fit.residualSD) return undefined;
  const decimals = curve.readings.reduce((d, x) => Math.max(d, decimalsOf(x)), 0);
  const step = 10 ** -decimals;
  if (offset <= MIN_OFFSET_STEPS * step) return undefined;
  // The intended value was written to the run's precision; a slip that added a digit is undone by
  // dropping one, and the reverse.
  const nearest = oneSlipCopies(reading, decimals)
    .filter((s) => decimalsOf(s.value) <= decimals)
    .map((s) => ({ ...s, kind: undo[s.kind], off: Math.abs(s.value - predicted) }))
    .sort((a, b) => a.off - b.off)[0];
  const onCurve = nearest && nearest.off <= Math.max(4 * fit.residualSD, 3 * step);
  return { index, reading, predicted, decimals, intended: onCurve ? { value: nearest.value, slip: nearest.kind } : undefined };
}
