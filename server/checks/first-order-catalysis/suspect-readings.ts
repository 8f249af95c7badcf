import { EngineError } from '../../engine/engine-error.ts';
import { fitFirstOrderNonlinear, type FirstOrderNonlinearFit } from '../../engine/first-order-nonlinear.ts';
import { decimalsOf, oneSlipCopies, type SlipKind } from '../digit-slips.ts';

/**
 * Readings far off the curve through the others, on a student's own data (no class table to copy
 * from). A reading is suspect when it lies more than SUSPECT_SDS residual standard deviations, and
 * more than MIN_OFFSET_STEPS display steps, from the curve fitted without it; the floor keeps the
 * last-digit scatter of a reading from ever being called a slip.
 */
const SUSPECT_SDS = 6;
const MIN_OFFSET_STEPS = 10;
const SCREEN_MARGIN = 1.5;

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

/** Copying slips from the most to the least common (common practice, no source). */
const SLIP_ORDER: SlipKind[] = ['transposed-digits', 'dropped-digit', 'extra-digit', 'decimal-point', 'sign-lost'];

interface Curve {
  times: number[];
  readings: number[];
  timeUnit: string;
  /** A rate constant to start the fit of all readings from (the run's own); else one is estimated. */
  startK?: number;
  /** The fit of all readings with x_inf fitted, where the caller has made it already. */
  fitOfAll?: FirstOrderNonlinearFit;
}

/** The curve without reading `skip`, started from the rate of the fit of all where there is one. */
function fitWithout(curve: Curve, skip: number, initialK?: number) {
  const times = curve.times.filter((_, i) => i !== skip);
  const readings = curve.readings.filter((_, i) => i !== skip);
  return fitFirstOrderNonlinear({ times, readings, timeUnit: curve.timeUnit }, { infinity: 'fitted', initialK });
}

/**
 * Whether reading i could lie SUSPECT_SDS residual SDs off the curve fitted without it, judged from
 * the fit of all readings alone. For a model linear in its parameters the curve without reading i
 * misses it by r_i / (1 - h_i) exactly, and the others' sum of squares is SSE - r_i^2 / (1 - h_i)
 * (h_i the reading's leverage). Near its optimum the exponential fit is close to linear (these estimates
 * agree with the refits to a few per cent), so a margin of 1.5 leaves the refits without a reading to the
 * runs where one might be suspect.
 */
function mightBeSuspect(all: FirstOrderNonlinearFit, i: number): boolean {
  const r = all.residuals[i];
  const free = 1 - all.leverages[i];
  if (!(free > 1e-6)) return true;
  const sse = all.residualSD ** 2 * all.dof;
  const sdWithout = Math.sqrt(Math.max(0, sse - (r * r) / free) / (all.dof - 1));
  return Math.abs(r) / free > (SUSPECT_SDS / SCREEN_MARGIN) * sdWithout;
}

/** The indices of the `count` largest residuals by size, largest first (the first index on a tie, as a stable sort gives). */
function worstFitting(residuals: number[], count: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < residuals.length; i++) {
    const size = Math.abs(residuals[i]);
    let at = out.length;
    while (at > 0 && Math.abs(residuals[out[at - 1]]) < size) at--;
    if (at < count) {
      out.splice(at, 0, i);
      if (out.length > count) out.pop();
    }
  }
  return out;
}

/**
 * The reading whose removal leaves the tightest curve. Only the three worst-fitting readings of a fit
 * of all are tried; when one reading is so far off that no fit of all converges, every reading is.
 */
function mostSuspect(curve: Curve) {
  let tried = curve.readings.map((_, i) => i);
  let initialK: number | undefined;
  try {
    const all = curve.fitOfAll ?? fitFirstOrderNonlinear({ ...curve }, { infinity: 'fitted', initialK: curve.startK });
    tried = worstFitting(all.residuals, 3);
    if (!tried.some((i) => mightBeSuspect(all, i))) return undefined;
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

/**
 * The leverage a left-out reading would have on the curve fitted without it: g' (J'J)^-1 g, with J the
 * other readings' gradients of x = x_inf + A e^(-k (t - t0)) in (x_inf, A, k) and g the reading's. A
 * reading past the others (the last one) is an extrapolation, predicted less surely than the scatter.
 */
function leverageAt(times: number[], index: number, origin: number, fit: FirstOrderNonlinearFit): number {
  const k = fit.k.value;
  const amplitude = fit.x0.value - fit.infinity.value;
  const gradient = (t: number) => {
    const e = Math.exp(-k * (t - origin));
    return [1, e, -amplitude * (t - origin) * e];
  };
  const m = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  times.forEach((t, j) => {
    if (j === index) return;
    const g = gradient(t);
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) m[3 * r + c] += g[r] * g[c];
  });
  const g = gradient(times[index]);
  const x = solve3(m, g);
  return x ? Math.max(0, g[0] * x[0] + g[1] * x[1] + g[2] * x[2]) : 0;
}

/** The solution of a 3 x 3 system M x = b by Cramer's rule, or undefined when M is singular. */
function solve3(m: number[], b: number[]): number[] | undefined {
  const det = (a: number[]) => a[0] * (a[4] * a[8] - a[5] * a[7]) - a[1] * (a[3] * a[8] - a[5] * a[6]) + a[2] * (a[3] * a[7] - a[4] * a[6]);
  const d = det(m);
  if (!(Math.abs(d) > 0)) return undefined;
  return [0, 1, 2].map((col) => det(m.map((v, i) => (i % 3 === col ? b[Math.floor(i / 3)] : v))) / d);
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
  // dropping one, and the reverse. Among the copies on the curve the commonest slip is named (two
  // neighbouring digits swapped, then a digit dropped or added): near the plateau a dropped or added
  // digit can land as close to the curve as the swap that was made.
  const band = Math.max(4 * fit.residualSD * Math.sqrt(1 + leverageAt(curve.times, index, origin, fit)), 3 * step);
  const intended = oneSlipCopies(reading, decimals)
    .filter((s) => decimalsOf(s.value) <= decimals && Math.abs(s.value - predicted) <= band)
    .map((s) => ({ value: s.value, slip: undo[s.kind] }))
    .sort((a, b) => SLIP_ORDER.indexOf(a.slip) - SLIP_ORDER.indexOf(b.slip) || Math.abs(a.value - predicted) - Math.abs(b.value - predicted))[0];
  return { index, reading, predicted, decimals, intended };
}
