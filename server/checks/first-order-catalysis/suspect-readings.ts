import { EngineError } from '../../engine/engine-error.ts';
import { fitFirstOrderNonlinear, type FirstOrderNonlinearFit } from '../../engine/first-order-nonlinear.ts';
import { decimalsOf, oneSlipCopies, type SlipKind } from '../digit-slips.ts';

/**
 * Readings far off the curve through the others, on a student's own data (no class table to copy
 * from). The run's scatter is measured robustly (robustScatter) on the curve fitted without the
 * reading, so that the slip itself, or a second one, does not hide in it. A reading is suspect when it
 * lies more than SUSPECT_SDS SDs from that curve, or more than REVERSAL_SDS while it turns the run back
 * (it rises where the run falls, or the other way) by more than REVERSAL_SDS SDs against a neighbour: a
 * careful reader circles a run that goes down, up and down again. The SD of the miss is the scatter
 * widened by the curve's own uncertainty at that time, which matters at the ends (the first reading is
 * an extrapolation of the others). Both need MIN_OFFSET_STEPS display steps too, so the last-digit
 * scatter of a reading shown more coarsely than it scatters is never called a slip.
 */
const SUSPECT_SDS = 6;
const REVERSAL_SDS = 3;
const MIN_OFFSET_STEPS = 10;
const SCREEN_MARGIN = 1.5;
/** A normal distribution's SD over its median absolute deviation. */
const MAD_TO_SD = 1.4826;
/** Residuals further than this many first (MAD) estimates of the scatter are left out of the second:
 * at 3.5 a first estimate small by chance cut honest residuals and called clean readings suspect. */
const CLIP_SDS = 5;
/** Parameters of the curve x = x_inf + A e^(-k t). */
const CURVE_PARAMETERS = 3;

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

/** The median of a non-empty list. */
function median(values: number[]): number {
  const sorted = values.slice().sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * The scatter of a run's readings about its curve, from the residuals of the curve's fit, robust to a
 * reading far off: a first estimate MAD_TO_SD times their median absolute deviation, then the root mean
 * square of the residuals within CLIP_SDS of those, on n - 3 degrees of freedom (the curve's three
 * parameters); 1.4826 = 1 / Φ^-1(3/4) (common practice, no source). The first alone varies from run to
 * run far more than a plain SD (the MAD's efficiency at the normal is 37 %: common practice, no source),
 * enough to call honest scatter a slip now and then; the second keeps every residual of honest work
 * and drops a slip. NaN where too few residuals are left to measure it.
 */
export function robustScatter(residuals: ArrayLike<number>): number {
  const r = Array.from(residuals).filter(Number.isFinite);
  if (r.length <= CURVE_PARAMETERS) return Number.NaN;
  const centre = median(r);
  const first = MAD_TO_SD * median(r.map((x) => Math.abs(x - centre)));
  const kept = r.filter((x) => Math.abs(x - centre) <= CLIP_SDS * first);
  if (kept.length <= CURVE_PARAMETERS) return first;
  return Math.sqrt(kept.reduce((sum, x) => sum + x * x, 0) / (kept.length - CURVE_PARAMETERS));
}

/**
 * How far reading i turns the run back against a neighbour: how much it lies beyond the reading
 * before it, or the reading after lies beyond it, against the run's direction (`direction` +1 for a run
 * that rises, -1 for one that falls); 0 where it keeps the run's direction.
 */
function reversalAt(readings: number[], i: number, direction: number): number {
  const back = i > 0 ? -direction * (readings[i] - readings[i - 1]) : 0;
  const ahead = i + 1 < readings.length ? -direction * (readings[i + 1] - readings[i]) : 0;
  return Math.max(0, back, ahead);
}

/**
 * Whether a reading `offset` from the curve without it is suspect: `spread` is the SD that offset would
 * have from scatter alone (the scatter widened by the uncertainty of the curve at that time), `scatter`
 * the readings' own, against which a turn back of `reversal` is judged.
 */
function isSuspect(offset: number, spread: number, reversal: number, scatter: number, floor: number): boolean {
  if (!(offset > floor)) return false;
  if (!(spread > 0)) return true;
  return offset > SUSPECT_SDS * spread || (offset > REVERSAL_SDS * spread && reversal > REVERSAL_SDS * scatter);
}

/**
 * The readings that might be suspect, judged from the fit of all readings alone, most off first (at
 * most three). For a model linear in its parameters the curve without reading i misses it by
 * r_i / (1 - h_i) exactly (h_i the reading's leverage), a miss whose SD from scatter alone is
 * sigma / sqrt(1 - h_i), and the others' sum of squares is SSE - r_i^2 / (1 - h_i). Near its optimum the
 * exponential fit is close to linear, so the tests of isSuspect with every bound divided by
 * SCREEN_MARGIN (1.5) leave the refits without a reading to the runs where one might be suspect. The
 * screen's scatter is that plain SD without the reading, not a robust one: a far first reading pulls
 * the fit of all so that every residual bends, which the sum of squares without it takes back out.
 */
function candidates(all: FirstOrderNonlinearFit, readings: number[], floor: number): number[] {
  const sse = all.residualSD ** 2 * all.dof;
  const direction = Math.sign(all.infinity.value - all.x0.value);
  const out: Array<{ index: number; offset: number }> = [];
  for (let i = 0; i < readings.length; i++) {
    const r = all.residuals[i];
    const free = 1 - all.leverages[i];
    if (!(free > 1e-6)) {
      out.push({ index: i, offset: Number.POSITIVE_INFINITY });
      continue;
    }
    const offset = Math.abs(r) / free;
    if (!(offset > floor / SCREEN_MARGIN)) continue;
    const scatter = Math.sqrt(Math.max(0, sse - (r * r) / free) / (all.dof - 1)) / SCREEN_MARGIN;
    if (isSuspect(offset, scatter / Math.sqrt(free), reversalAt(readings, i, direction), scatter, floor / SCREEN_MARGIN)) out.push({ index: i, offset });
  }
  return out
    .sort((a, b) => b.offset - a.offset || a.index - b.index)
    .slice(0, 3)
    .map((c) => c.index);
}

interface Found {
  index: number;
  predicted: number;
  /** The scatter of the readings about the curve without this one. */
  sd: number;
  /** The variance of that curve at the reading's time, in units of sd^2 (leverageAt). */
  leverage: number;
}

/**
 * The suspect reading whose removal leaves the tightest curve. Only the screen's candidates are
 * refitted without; when one reading is so far off that no fit of all converges, every reading is.
 */
function mostSuspect(curve: Curve, floor: number): Found | undefined {
  let tried = curve.readings.map((_, i) => i);
  let initialK: number | undefined;
  try {
    const all = curve.fitOfAll ?? fitFirstOrderNonlinear({ ...curve }, { infinity: 'fitted', initialK: curve.startK });
    tried = candidates(all, curve.readings, floor);
    initialK = all.k.value;
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
  }
  let best: { found: Found; score: number } | undefined;
  for (const index of tried) {
    let fit: FirstOrderNonlinearFit;
    try {
      fit = fitWithout(curve, index, initialK);
    } catch (error) {
      if (!(error instanceof EngineError)) throw error;
      continue;
    }
    // Times count from the first reading; without reading 0 they count from reading 1.
    const origin = index === 0 ? curve.times[1] : curve.times[0];
    const predicted = fit.infinity.value + (fit.x0.value - fit.infinity.value) * Math.exp(-fit.k.value * (curve.times[index] - origin));
    const offset = Math.abs(curve.readings[index] - predicted);
    const sd = robustScatter(fit.residuals);
    const leverage = leverageAt(curve.times, index, origin, fit);
    const direction = Math.sign(fit.infinity.value - fit.x0.value);
    if (!isSuspect(offset, sd * Math.sqrt(1 + leverage), reversalAt(curve.readings, index, direction), sd, floor)) continue;
    // A reading next to a slip can look off the curve the slip pulls; leaving out the slip leaves the tightest curve.
    const score = fit.residualSD;
    if (!best || score < best.score) best = { found: { index, predicted, sd, leverage }, score };
  }
  return best?.found;
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
  const decimals = curve.readings.reduce((d, x) => Math.max(d, decimalsOf(x)), 0);
  const step = 10 ** -decimals;
  const best = mostSuspect(curve, MIN_OFFSET_STEPS * step);
  if (!best) return undefined;
  const { index, predicted, sd, leverage } = best;
  const reading = curve.readings[index];
  // The intended value was written to the run's precision; a slip that added a digit is undone by
  // dropping one, and the reverse. Among the copies on the curve the commonest slip is named (two
  // neighbouring digits swapped, then a digit dropped or added): near the plateau a dropped or added
  // digit can land as close to the curve as the swap that was made.
  const band = Math.max(4 * (sd || 0) * Math.sqrt(1 + leverage), 3 * step);
  const intended = oneSlipCopies(reading, decimals)
    .filter((s) => decimalsOf(s.value) <= decimals && Math.abs(s.value - predicted) <= band)
    .map((s) => ({ value: s.value, slip: undo[s.kind] }))
    .sort((a, b) => SLIP_ORDER.indexOf(a.slip) - SLIP_ORDER.indexOf(b.slip) || Math.abs(a.value - predicted) - Math.abs(b.value - predicted))[0];
  return { index, reading, predicted, decimals, intended };
}
