import { inverseNormalMatrix } from '../../../server/engine/covariance.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { fitFirstOrderNonlinear, type FirstOrderNonlinearFit } from '../../../server/engine/first-order-nonlinear.ts';
import { oneSlipCopies, type SlipKind } from '../../../server/checks/digit-slips.ts';
import { decimalsOf } from '../../../server/engine/decimal-places.ts';

/**
 * Readings far off the curve through the others, on a student's own data (no class table to copy
 * from). The run's scatter is measured robustly (robustScatter) on the curve fitted without the
 * reading, so that the slip itself, or a second one, does not hide in it. A reading is suspect when it
 * lies more than SUSPECT_SDS SDs from that curve, or more than REVERSAL_SDS while it turns the run back
 * (it rises where the run falls, or the other way) by more than REVERSAL_SDS SDs against a neighbour: a
 * careful reader circles a run that goes down, up and down again. The SD of the miss is the scatter
 * widened by the curve's own uncertainty at that time, which matters at the ends (the first reading is
 * an extrapolation of the others). Both need MIN_OFFSET_STEPS display steps too, so the last-digit
 * scatter of a reading shown more coarsely than it scatters is never called a slip. Where the student
 * measured x_inf and it agrees with the readings, it is one more reading, taken long after the run
 * (withMeasuredEnd): it pins the curve's end, so the curve extrapolates more tightly to the first reading.
 * The scatter is pooled with the student's other runs where it agrees with theirs (pooledScatter).
 */
const SUSPECT_SDS = 6;
const REVERSAL_SDS = 3;
/** A swap of two neighbouring digits that puts a reading within this many SDs of its miss of the curve explains it. */
const ON_CURVE_SDS = 1.5;
/**
 * Where the curve is itself uncertain, its variance at the reading at least the scatter's (leverage 1
 * or more: the first reading of a steep run), a reading SUSPECT_SDS SDs of scatter off is named when
 * its miss is more than EXPLAINED_SDS of its own SDs and a swap explains it (ON_CURVE_SDS).
 */
const EXPLAINED_SDS = 3.5;
const UNCERTAIN_CURVE_LEVERAGE = 1;
/**
 * A run's scatter within this factor of the student's other runs' is taken as the same instrument's,
 * read the same way, and pooled with theirs: measured on a dozen readings alone it is often a third
 * off, high enough to hide a slip or low enough to call honest scatter one. Beyond it the run's own
 * is used (one run read more roughly, or more carefully, than the others).
 */
const SAME_SCATTER_RATIO = 2;
const MIN_OFFSET_STEPS = 10;
const SCREEN_MARGIN = 1.5;
/** A normal distribution's SD over its median absolute deviation. */
const MAD_TO_SD = 1.4826;
/** Residuals further than this many first (MAD) estimates of the scatter are left out of the second:
 * at 3.5 a first estimate small by chance cut honest residuals and called clean readings suspect. */
const CLIP_SDS = 5;
/** Parameters of the curve x = x_inf + A e^(-k t) with x_inf fitted. */
const CURVE_PARAMETERS = 3;
/**
 * A measured x_inf further than this many SDs from the one the readings imply (the fit of all with
 * x_inf fitted, its SE and the scatter combined) is not taken among the readings: a slip in x_inf
 * would bend the curve and call honest readings suspect.
 */
const INFINITY_AGREES_SDS = 4;

export interface SuspectReading {
  index: number;
  reading: number;
  /** The curve's value at that time, fitted without the reading. */
  predicted: number;
  /** Decimal places the run's readings are written to. */
  decimals: number;
  /** A one-slip copy of the reading that lies on the curve, if one does. */
  intended?: { value: number; slip: SlipKind };
  /**
   * Where the reading is named only because it turns the run back (not 6 SDs off): whether it lies
   * beyond the reading before it or the reading after lies beyond it, against the run's direction.
   */
  turnsBack?: { against: 'before' | 'after'; runRises: boolean };
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
  /** The student's measured x_inf, if any. */
  infinity?: number;
  /** The scatter of the student's other runs, pooled (runScatter, poolScatters). */
  otherRuns?: Scatter;
}

/** A scatter measured about a fitted curve, with its degrees of freedom. */
export interface Scatter {
  sd: number;
  dof: number;
}

/** The scatter of a run's readings about its fit with x_inf fitted (robustScatter). */
export function runScatter(fit: FirstOrderNonlinearFit): Scatter {
  return { sd: robustScatter(fit.residuals), dof: fit.residuals.length - CURVE_PARAMETERS };
}

/** Scatters pooled on their degrees of freedom (variances averaged); undefined when none is finite. */
export function poolScatters(scatters: Scatter[]): Scatter | undefined {
  const usable = scatters.filter((s) => s.sd > 0 && s.dof > 0);
  const dof = usable.reduce((sum, s) => sum + s.dof, 0);
  if (dof === 0) return undefined;
  return { sd: Math.sqrt(usable.reduce((sum, s) => sum + s.dof * s.sd * s.sd, 0) / dof), dof };
}

/** A run's own scatter pooled with its other runs' where the two agree within SAME_SCATTER_RATIO. */
function pooledScatter(own: Scatter, others: Scatter | undefined): number {
  if (!others || !(own.sd < SAME_SCATTER_RATIO * others.sd && others.sd < SAME_SCATTER_RATIO * own.sd)) return own.sd;
  return poolScatters([own, others])!.sd;
}

/** The curve without reading `skip`, started from the rate of the fit of all where there is one. */
function fitWithout(curve: Curve, skip: number, initialK?: number) {
  const times = curve.times.filter((_, i) => i !== skip);
  const readings = curve.readings.filter((_, i) => i !== skip);
  return fitFirstOrderNonlinear({ times, readings, timeUnit: curve.timeUnit }, { infinity: 'fitted', initialK });
}

/** The median of a non-empty list, which it sorts. */
function medianSorting(values: Float64Array): number {
  const sorted = values.sort();
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
  let sd = scatterOf.get(residuals);
  if (sd === undefined) {
    sd = measureScatter(residuals);
    scatterOf.set(residuals, sd);
  }
  return sd;
}

/**
 * Scatters measured, by the residuals measured: a run's is asked for again by each of the student's
 * other runs (the scatter pooled from them) and by the search for a suspect reading, and a fit's
 * residuals never change once made. Measuring them again was 2-3 % of `check --jsonl` in a profile.
 */
const scatterOf = new WeakMap<ArrayLike<number>, number>();

// Loops over typed arrays, not filter/map/reduce: the arrays those made were garbage on every call.
// The sum of squares runs in the residuals' order, as before.
function measureScatter(residuals: ArrayLike<number>): number {
  const finite = new Float64Array(residuals.length);
  let n = 0;
  for (let i = 0; i < residuals.length; i++) if (Number.isFinite(residuals[i])) finite[n++] = residuals[i];
  if (n <= CURVE_PARAMETERS) return Number.NaN;
  const r = finite.subarray(0, n);
  const centre = medianSorting(r.slice());
  const deviations = new Float64Array(n);
  for (let i = 0; i < n; i++) deviations[i] = Math.abs(r[i] - centre);
  const first = MAD_TO_SD * medianSorting(deviations);
  let sum = 0;
  let kept = 0;
  for (let i = 0; i < n; i++) {
    if (!(Math.abs(r[i] - centre) <= CLIP_SDS * first)) continue;
    sum += r[i] * r[i];
    kept++;
  }
  if (kept <= CURVE_PARAMETERS) return first;
  return Math.sqrt(sum / (kept - CURVE_PARAMETERS));
}

interface Reversal {
  size: number;
  against: 'before' | 'after';
}

/**
 * How far reading i turns the run back against a neighbour: how much it lies beyond the reading
 * before it, or the reading after lies beyond it, against the run's direction (`direction` +1 for a run
 * that rises, -1 for one that falls); 0 where it keeps the run's direction.
 */
function reversalAt(readings: number[], i: number, direction: number): Reversal {
  const back = i > 0 ? -direction * (readings[i] - readings[i - 1]) : 0;
  const ahead = i + 1 < readings.length ? -direction * (readings[i + 1] - readings[i]) : 0;
  return ahead > back ? { size: Math.max(0, ahead), against: 'after' } : { size: Math.max(0, back), against: 'before' };
}

/**
 * Whether a reading `offset` from the curve without it is suspect, and by which rule: `spread` is the
 * SD that offset would have from scatter alone (the scatter widened by the uncertainty of the curve at
 * that time), `scatter` the readings' own, against which a turn back of `reversal` is judged.
 */
function suspectBy(offset: number, spread: number, reversal: number, scatter: number, floor: number): 'far' | 'turns-back' | undefined {
  if (!(offset > floor)) return undefined;
  if (!(spread > 0) || offset > SUSPECT_SDS * spread) return 'far';
  return offset > REVERSAL_SDS * spread && reversal > REVERSAL_SDS * scatter ? 'turns-back' : undefined;
}

/**
 * The readings that might be suspect, judged from the fit of all readings alone, most off first (at
 * most three). For a model linear in its parameters the curve without reading i misses it by
 * r_i / (1 - h_i) exactly (h_i the reading's leverage), a miss whose SD from scatter alone is
 * sigma / sqrt(1 - h_i), and the others' sum of squares is SSE - r_i^2 / (1 - h_i). Near its optimum the
 * exponential fit is close to linear, so the tests of suspectBy with every bound divided by
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
    const spread = scatter / Math.sqrt(free);
    const explainable = 1 / free - 1 >= UNCERTAIN_CURVE_LEVERAGE / SCREEN_MARGIN && offset > SUSPECT_SDS * scatter && offset > EXPLAINED_SDS * spread;
    if (explainable || suspectBy(offset, spread, reversalAt(readings, i, direction).size, scatter, floor / SCREEN_MARGIN)) out.push({ index: i, offset });
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
  turnsBack?: SuspectReading['turnsBack'];
}

/**
 * The run with the measured x_inf as one more reading, long after the others, where it agrees with
 * the readings (see INFINITY_AGREES_SDS); x_inf is read on the same instrument once the reaction is
 * over, so it scatters as a reading does (common practice, no source). So far past the run that
 * e^(-k t) is 0 there for any k that moves the run by a part in a thousand, it bears on x_inf alone.
 * With it, the fit of all readings with x_inf fitted, if it converges. A run whose fit without x_inf
 * leaves no reading for the screen (candidates) is spared the second fit.
 */
function withMeasuredEnd(curve: Curve, floor: number): { curve: Curve; all?: FirstOrderNonlinearFit } {
  let free: FirstOrderNonlinearFit;
  try {
    free = curve.fitOfAll ?? fitFirstOrderNonlinear({ ...curve }, { infinity: 'fitted', initialK: curve.startK });
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    return { curve };
  }
  const measured = curve.infinity;
  const sd = Math.hypot(free.infinity.standardError, robustScatter(free.residuals));
  if (measured === undefined || !(Math.abs(measured - free.infinity.value) <= INFINITY_AGREES_SDS * sd)) return { curve, all: free };
  if (candidates(free, curve.readings, floor).length === 0) return { curve, all: free };
  const first = curve.times[0];
  const last = curve.times[curve.times.length - 1];
  const extended = { ...curve, times: [...curve.times, last + 1e6 * (last - first)], readings: [...curve.readings, measured] };
  try {
    return { curve: extended, all: fitFirstOrderNonlinear(extended, { infinity: 'fitted', initialK: free.k.value }) };
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    return { curve, all: free };
  }
}

/**
 * The suspect reading whose removal leaves the tightest curve. Only the screen's candidates are
 * refitted without; when one reading is so far off that no fit of all converges, every reading is.
 */
function mostSuspect(given: Curve, decimals: number, floor: number): Found | undefined {
  const { curve, all } = withMeasuredEnd(given, floor);
  // The measured x_inf, where it is among the readings, is never named itself.
  const tried = all ? candidates(all, given.readings, floor) : given.readings.map((_, i) => i);
  const initialK = all?.k.value;
  let best: { found: Found; explained: boolean; score: number } | undefined;
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
    const sd = pooledScatter(runScatter(fit), given.otherRuns);
    const leverage = leverageAt(curve.times, index, origin, fit);
    const direction = Math.sign(fit.infinity.value - fit.x0.value);
    const reversal = reversalAt(given.readings, index, direction);
    const spread = sd * Math.sqrt(1 + leverage);
    const explained = meantValue(given.readings[index], decimals, predicted, ON_CURVE_SDS * spread)?.slip === 'transposed-digits';
    const explains = explained && leverage >= UNCERTAIN_CURVE_LEVERAGE && offset > floor && offset > SUSPECT_SDS * sd && offset > EXPLAINED_SDS * spread;
    const rule = suspectBy(offset, spread, reversal.size, sd, floor) ?? (explains ? 'far' : undefined);
    if (!rule) continue;
    const turnsBack = rule === 'turns-back' ? { against: reversal.against, runRises: direction > 0 } : undefined;
    // A reading next to a slip can look off the curve the slip pulls (most of all beside a first reading,
    // which the curve without its neighbour follows closely): the one a swap puts on the curve is named
    // first, then the one whose removal leaves the tightest curve.
    const score = fit.residualSD;
    if (!best || (explained && !best.explained) || (explained === best.explained && score < best.score)) best = { found: { index, predicted, sd, leverage, turnsBack }, explained, score };
  }
  return best?.found;
}

/**
 * The leverage a left-out reading would have on the curve fitted without it: g' (J'J)^-1 g, with J the
 * other readings' gradients of x = x_inf + A e^(-k (t - t0)) in (x_inf, A, k) and g the reading's. A
 * reading past the others (the first or the last) is an extrapolation, predicted less surely than the
 * scatter.
 */
function leverageAt(times: number[], index: number, origin: number, fit: FirstOrderNonlinearFit): number {
  const k = fit.k.value;
  const amplitude = fit.x0.value - fit.infinity.value;
  const gradient = (t: number) => {
    const e = Math.exp(-k * (t - origin));
    return [1, e, -amplitude * (t - origin) * e];
  };
  const others = times.filter((_, j) => j !== index).map(gradient);
  let inverse: number[];
  try {
    inverse = inverseNormalMatrix([0, 1, 2].map((c) => others.map((g) => g[c])));
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    return 0;
  }
  const g = gradient(times[index]);
  let leverage = 0;
  for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) leverage += g[r] * inverse[3 * r + c] * g[c];
  return Math.max(0, leverage);
}

/**
 * The value a reading was probably meant as: a one-slip copy within `band` of the curve. The intended
 * value was written to the run's precision; a slip that added a digit is undone by dropping one, and
 * the reverse. Among the copies on the curve the commonest slip is named (two neighbouring digits
 * swapped, then a digit dropped or added): near the plateau a dropped or added digit can land as close
 * to the curve as the swap that was made.
 */
function meantValue(reading: number, decimals: number, predicted: number, band: number): SuspectReading['intended'] {
  return oneSlipCopies(reading, decimals)
    .filter((s) => decimalsOf(s.value) <= decimals && Math.abs(s.value - predicted) <= band)
    .map((s) => ({ value: s.value, slip: undo[s.kind] }))
    .sort((a, b) => SLIP_ORDER.indexOf(a.slip) - SLIP_ORDER.indexOf(b.slip) || Math.abs(a.value - predicted) - Math.abs(b.value - predicted))[0];
}

export function findSuspectReading(curve: Curve): SuspectReading | undefined {
  const n = curve.readings.length;
  if (n < 6) return undefined;
  const decimals = curve.readings.reduce((d, x) => Math.max(d, decimalsOf(x)), 0);
  const step = 10 ** -decimals;
  const best = mostSuspect(curve, decimals, MIN_OFFSET_STEPS * step);
  if (!best) return undefined;
  const { index, predicted, sd, leverage, turnsBack } = best;
  const reading = curve.readings[index];
  const intended = meantValue(reading, decimals, predicted, Math.max(4 * (sd || 0) * Math.sqrt(1 + leverage), 3 * step));
  return { index, reading, predicted, decimals, intended, turnsBack };
}
