import type { Order, Settings, Submission } from '../schemas.ts';
import { convert } from '../../../server/engine/units.ts';
import { placesFor, reportedValue, toFigures, toPlaces } from '../../../server/demo/careful-rounding.ts';
import { gaussian } from '../../../server/demo/seeded-random.ts';
import { fitLinearLaw, halfLifeFormula } from '../integrated-laws.ts';
import { kUnitOf } from '../order-analysis.ts';
import { signalLine, type SignalLine } from '../signal-conversion.ts';

/**
 * Seeded generator of invented `reaction-order` submissions, clean or with one slip. Not measurements:
 * two runs, [A]_0 of the second 0.6 times the first (1.4 times for order 0, which would otherwise run
 * out), 13 readings every `span`/12 min; k set so the first run covers `coverage` half-lives (order 0 at
 * most 1.8, i.e. 90 % reacted); Gaussian noise of SD `noise` times the first run's initial signal change,
 * readings rounded to 0.001 (absorbance, mS) or 4 figures of [A]_0 (concentration).
 *
 * The clean student converts each reading to [A] as the assignment says, fits the straight-line form of
 * the true order over both runs (one slope, an intercept per run: the kind's own linear fit, the way a
 * spreadsheet with a column per run is set up; a log10 line's slope is ln's over ln 10), reports k to the place of its SE's second figure in
 * M^(1−n) per minute, and each run's half-life by the order's formula with their first [A], to 3
 * figures. A slip is carried forward: what the student computes after it comes from their own numbers.
 */
export const orderSlips = [
  'order-not-supported',
  'k-unit-order',
  'other-order-law',
  'path-length',
  'transmittance',
  'absorptivity-unit',
  'end-absorbance',
  'half-life-formula',
  'stoichiometric-k',
  'log-base',
  'sign-flipped',
  'time-unit',
  'concentration-unit',
  'sig-figs',
] as const;
export type OrderSlip = (typeof orderSlips)[number];

/** Where the checker names each slip first; `stoichiometric-k` is a convention, named in a note and never charged. */
export const slipPlace: Record<OrderSlip, string> = {
  'order-not-supported': 'reported.order',
  'k-unit-order': 'reported.k.unit',
  'other-order-law': 'reported.k',
  'path-length': 'reported.k',
  transmittance: 'reported.k',
  'absorptivity-unit': 'reported.k',
  'end-absorbance': 'reported.k',
  'half-life-formula': 'runs[0].reported.halfLife',
  'stoichiometric-k': 'reported.k',
  'log-base': 'reported.k',
  'sign-flipped': 'reported.k',
  'time-unit': 'reported.k',
  'concentration-unit': 'reported.k',
  'sig-figs': 'reported.k',
};

export interface TrueRun {
  order: Order;
  /** Half-lives the first run covers. */
  coverage?: number;
  /** Noise SD as a share of the first run's initial signal change. */
  noise?: number;
  /** Minutes the runs last. */
  span?: number;
}

const READINGS = 13;

/** [A] at t by the integrated law (order 0 stops at zero, as the reactant runs out). */
function concentrationAt(order: Order, c0: number, k: number, t: number): number {
  if (order === 0) return Math.max(0, c0 - k * t);
  if (order === 1) return c0 * Math.exp(-k * t);
  return c0 / (1 + k * c0 * t);
}

interface StudentK {
  k: number;
  se: number;
}

/** The student's k of a law's straight line over every run; with log10 for ln the line's slope, and so k, is 1/ln 10 of ln's. */
function studentK(order: Order, runs: ReadonlyArray<{ t: number[]; c: number[] }>, log10: boolean): StudentK {
  const { value, standardError } = fitLinearLaw(order, runs, kUnitOf(order, 'min')).k;
  const scale = log10 && order === 1 ? 1 / Math.LN10 : 1;
  return { k: value * scale, se: standardError * scale };
}
const neighbour = (order: Order): Order => (order === 1 ? 2 : 1);

/**
 * The slips that scale [A] by a factor s (the path length left out: s = l in cm; ε's number taken as
 * M⁻¹ cm⁻¹: its unit's factor; mM for M: 1000). k of order n goes as s^(1−n): s for order 0, 1/s for
 * order 2, unchanged for order 1.
 */
function concentrationScales(settings: Settings): Array<[OrderSlip, number]> {
  const signal = settings.signal;
  const scales: Array<[OrderSlip, number]> = [];
  if (signal.type === 'absorbance') {
    scales.push(['path-length', convert(signal.pathLength.value, signal.pathLength.unit, 'cm')]);
    scales.push(['absorptivity-unit', convert(signal.molarAbsorptivity.value, signal.molarAbsorptivity.unit, 'M^-1 cm^-1') / signal.molarAbsorptivity.value]);
  }
  scales.push(['concentration-unit', 1000]);
  return scales;
}

const SCALINGS: readonly OrderSlip[] = ['path-length', 'absorptivity-unit', 'concentration-unit'];
const near = (a: number, b: number) => Math.abs(a / b - 1) < 0.01;

/**
 * The slips that change what a student of this order reports under these settings, each told apart
 * from the others: a scaling of [A] leaves a first-order k as it is; one that halves k is the
 * stoichiometric convention, which is right; two scalings that give k the same factor (ε in mM⁻¹ cm⁻¹
 * read as M⁻¹ cm⁻¹, and [A] in mM) are one slip to the checker, the first kept. A_∞ left in shifts [A]
 * by a constant, which leaves a zero-order k as it is.
 */
export function slipsFor(settings: Settings, order: Order): OrderSlip[] {
  const signal = settings.signal;
  const kept: number[] = [];
  const scaled = new Set<OrderSlip>();
  for (const [slip, s] of concentrationScales(settings)) {
    const f = order === 0 ? s : 1 / s;
    if (order === 1 || near(f, 1) || near(f, 0.5) || kept.some((g) => near(f, g))) continue;
    kept.push(f);
    scaled.add(slip);
  }
  return orderSlips.filter((slip) => {
    if (SCALINGS.includes(slip)) return scaled.has(slip);
    if (slip === 'log-base') return order === 1;
    if (slip === 'end-absorbance') return signal.type === 'absorbance' && order !== 0 && (signal.endAbsorbance ?? 0) !== 0;
    if (slip === 'transmittance') return signal.type === 'absorbance';
    return true;
  });
}

/** How the student turns a reading into [A]: right, or by a slip of the Beer-Lambert law. */
function studentConversion(settings: Settings, line: SignalLine, slip: OrderSlip | undefined): (x: number) => number {
  const signal = settings.signal;
  if (signal.type === 'absorbance') {
    const epsilon = convert(signal.molarAbsorptivity.value, signal.molarAbsorptivity.unit, 'M^-1 cm^-1');
    const l = convert(signal.pathLength.value, signal.pathLength.unit, 'cm');
    if (slip === 'path-length') return (a) => (a - line.offset) / epsilon;
    if (slip === 'absorptivity-unit') return (a) => (a - line.offset) / (signal.molarAbsorptivity.value * l);
    if (slip === 'end-absorbance') return (a) => a / line.perMolar;
    // T = 10^-A taken for the absorbance, with no A_inf to subtract from it.
    if (slip === 'transmittance') return (a) => 10 ** -a / line.perMolar;
  }
  const scale = slip === 'concentration-unit' ? 1000 : 1;
  return (x) => (scale * (x - line.offset)) / line.perMolar;
}

/** `value` to `places` decimals (negative: tens, hundreds), as `7.4e2`: its last figure is the place. */
function coarser(value: number, places: number): string {
  const figures = Math.max(1, Math.floor(Math.log10(Math.abs(value))) + places + 1);
  return value.toExponential(figures - 1);
}

function roundReading(settings: Settings, value: number, c0: number): number {
  if (settings.signal.type !== 'concentration') return toPlaces(value, 3);
  return toPlaces(value, placesFor(c0 * convert(1, 'M', settings.signal.unit), 4));
}

export function orderSubmission(random: () => number, settings: Settings, studentId: string, truth: TrueRun, slip?: OrderSlip): Submission {
  const uniform = (low: number, high: number) => low + (high - low) * random();
  const { order } = truth;
  const span = truth.span ?? 36;
  const coverage = order === 0 ? Math.min(truth.coverage ?? 2, 1.8) : (truth.coverage ?? 2);
  const line = signalLine(settings.signal);
  // The first run's initial signal change: an absorbance of 0.7 to 0.9, 40 to 60 mM, or 15 to 25 mM of conductance's reactant.
  const c0 = settings.signal.type === 'absorbance' ? uniform(0.7, 0.9) / line.perMolar : settings.signal.type === 'concentration' ? uniform(0.04, 0.06) : uniform(0.015, 0.025);
  const c0s = [c0, (order === 0 ? 1.4 : 0.6) * c0];
  const halfLife = (span / coverage) * uniform(0.9, 1.1);
  const k = order === 0 ? c0 / (2 * halfLife) : order === 1 ? Math.LN2 / halfLife : 1 / (halfLife * c0);
  const sd = (truth.noise ?? 0.005) * c0 * line.perMolar;
  const times = Array.from({ length: READINGS }, (_, i) => (i * span) / (READINGS - 1));
  const runs = c0s.map((c, r) => ({
    label: `${r + 1}`,
    timeUnit: 'min',
    readings: times.map((t): [number, number] => [t, roundReading(settings, line.offset + line.perMolar * concentrationAt(order, c, k, t) + sd * gaussian(random), c0)]),
  }));

  // The student's own work from the readings as written.
  const toC = studentConversion(settings, line, slip);
  const theirRuns = runs.map((run) => ({ t: run.readings.map(([t]) => t), c: run.readings.map(([, x]) => toC(x)) }));
  const reportedOrder = slip === 'order-not-supported' ? (order === 1 ? (random() < 0.5 ? 0 : 2) : 1) : order;
  const lawOrder = slip === 'other-order-law' ? neighbour(order) : reportedOrder;
  let fit: StudentK = studentK(lawOrder, theirRuns, slip === 'log-base');
  if (slip === 'stoichiometric-k') fit = { k: fit.k / 2, se: fit.se / 2 };
  // T rises as A falls: the line runs the other way, and the student drops the sign of its k.
  if (slip === 'transmittance') fit = { k: Math.abs(fit.k), se: fit.se };
  const time = settings.units.time;
  const unitOrder = slip === 'k-unit-order' ? neighbour(reportedOrder) : reportedOrder;
  // In the assignment's time unit, written as per second (per minute where seconds are asked) for the time-unit slip.
  const unit = kUnitOf(unitOrder, slip === 'time-unit' ? (time === 's' ? 'min' : 's') : time);
  const kValue = convert(1, kUnitOf(unitOrder, 'min'), kUnitOf(unitOrder, time)) * fit.k;
  const seValue = convert(1, kUnitOf(unitOrder, 'min'), kUnitOf(unitOrder, time)) * fit.se;
  const reported = reportedValue(slip === 'sign-flipped' ? -kValue : kValue, seValue, unit);
  // Two places coarser than the SE's second figure, written with a power of ten so that no trailing zero leaves the place in doubt.
  if (slip === 'sig-figs') reported.value = coarser(Number(reported.value), placesFor(seValue, 2) - 2);

  // Half-lives from their k (per minute) and their first [A]; the stoichiometric convention's k' is half the loss rate's k.
  const formulaOrder = slip === 'half-life-formula' ? ((reportedOrder + 1) % 3) as Order : reportedOrder;
  const kForHalfLife = slip === 'stoichiometric-k' ? 2 * fit.k : fit.k;
  const perTime = convert(1, 'min', time);
  return {
    studentId,
    runs: runs.map((run, r) => ({
      ...run,
      reported: { halfLife: { value: toFigures(halfLifeFormula(formulaOrder, kForHalfLife, theirRuns[r].c[0]) * perTime, 3), unit: time } },
    })),
    reported: { order: reportedOrder, k: reported },
  };
}
