import { gaussian, seededRandom } from '../../server/demo/seeded-random.ts';

/**
 * Generated reaction-order work for the recall tests: runs that follow a law of known order with noise
 * of a stated share of the initial signal, and the values a student would report, each worked out here
 * by a spreadsheet's own steps (its SLOPE of the linear form, run by run, the ks averaged) with at
 * most one known slip. Independent of the checker: nothing here imports the kind's engine; the checker
 * is then asked to name the slip made.
 */
export type Order = 0 | 1 | 2;
export type Slip =
  | 'none'
  | 'order-not-supported'
  | 'k-unit-order'
  | 'other-order-law'
  | 'path-length'
  | 'transmittance'
  | 'absorptivity-unit'
  | 'end-absorbance'
  | 'half-life-formula'
  | 'log-base'
  | 'sign-flipped'
  | 'time-unit'
  | 'stoichiometric-k';

/** The slips that cost points, each of which the checker must name. */
export const CHARGED_SLIPS: Slip[] = ['order-not-supported', 'k-unit-order', 'other-order-law', 'path-length', 'transmittance', 'absorptivity-unit', 'end-absorbance', 'half-life-formula', 'log-base', 'sign-flipped', 'time-unit'];

/** The orders a slip can show in: log10 only in a first-order line; a slip that scales [A] leaves a first-order k alone. */
export function ordersFor(slip: Slip): Order[] {
  if (slip === 'log-base') return [1];
  if (slip === 'path-length' || slip === 'absorptivity-unit') return [0, 2];
  return [0, 1, 2];
}

/** Whether a finding that costs points names the slip. */
export const slipNamed = (findings: ReadonlyArray<{ code: string; alsoCodes?: string[]; pointsLost: number }>, slip: Slip): boolean =>
  findings.some((f) => f.pointsLost > 0 && (f.code === slip || f.alsoCodes?.includes(slip)));

export interface WorkOptions {
  order: Order;
  slip: Slip;
  seed: number;
  /** Share of the first reading's signal, as the SD of each reading's noise: 0.01 by default. */
  noise?: number;
  runs?: number;
  readings?: number;
  /** Half-lives each run covers: two by default (to a quarter of [A]_0, whatever the order). */
  halfLives?: number;
  signal?: 'concentration' | 'absorbance';
}

export interface GeneratedWork {
  settings: Record<string, unknown>;
  submission: { studentId: string; runs: Array<Record<string, unknown>>; reported: { order: Order; k: { value: string; uncertainty: string; unit: string } } };
  trueK: number;
  /** Whether the slip moves a reported number (k or a half-life) by more than 3 % from the same work without it. */
  visible: boolean;
}

const KUNIT: Record<Order, string> = { 0: 'M min^-1', 1: 'min^-1', 2: 'M^-1 min^-1' };

function law(order: Order, c0: number, k: number, t: number): number {
  if (order === 0) return c0 - k * t;
  if (order === 1) return c0 * Math.exp(-k * t);
  return c0 / (1 + c0 * k * t);
}

/** The time at which [A] is down to [A]_0 / 2^m (m half-lives, each the half-life at its own start). */
function timeFor(order: Order, c0: number, k: number, halfLives: number): number {
  const c = c0 / 2 ** halfLives;
  if (order === 0) return (c0 - c) / k;
  if (order === 1) return Math.log(c0 / c) / k;
  return (1 / c - 1 / c0) / k;
}

/** A spreadsheet's SLOPE and its standard error (ordinary least squares, y = a + b x). */
function slope(x: number[], y: number[]): { b: number; se: number } {
  const n = x.length;
  const mx = x.reduce((a, v) => a + v, 0) / n;
  const my = y.reduce((a, v) => a + v, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  const b = sxy / sxx;
  let sse = 0;
  for (let i = 0; i < n; i++) sse += (y[i] - my - b * (x[i] - mx)) ** 2;
  return { b, se: Math.sqrt(sse / (n - 2) / sxx) };
}

/** k by the order's linear form, each run its own line, the ks averaged (one run: its own SE). */
function studentK(order: Order, runs: Array<{ t: number[]; c: number[] }>, log = Math.log): { k: number; se: number } {
  const fits = runs.map(({ t, c }) => {
    const keep = c.map((v, i) => (order === 0 || v > 0 ? i : -1)).filter((i) => i >= 0);
    const y = keep.map((i) => (order === 0 ? c[i] : order === 1 ? log(c[i]) : 1 / c[i]));
    const fit = slope(keep.map((i) => t[i]), y);
    return { k: order === 2 ? fit.b : -fit.b, se: fit.se };
  });
  const k = fits.reduce((a, f) => a + f.k, 0) / fits.length;
  if (fits.length === 1) return fits[0];
  const sd = Math.sqrt(fits.reduce((a, f) => a + (f.k - k) ** 2, 0) / (fits.length - 1));
  return { k, se: sd / Math.sqrt(fits.length) };
}

const halfLife = (order: Order, k: number, c0: number) => (order === 0 ? c0 / (2 * k) : order === 1 ? Math.LN2 / k : 1 / (k * c0));

const written = (x: number, figures = 4) => x.toPrecision(figures);
/** An SE to two figures and its value to the same place. */
function writtenPair(value: number, se: number): { value: string; uncertainty: string } {
  const place = Math.floor(Math.log10(Math.abs(se))) - 1;
  const decimals = Math.max(0, -place);
  return { value: (Math.round(value / 10 ** place) * 10 ** place).toFixed(decimals), uncertainty: (Math.round(se / 10 ** place) * 10 ** place).toFixed(decimals) };
}

export function generateWork(o: WorkOptions): GeneratedWork {
  const random = seededRandom(o.seed);
  const between = (a: number, b: number) => a + (b - a) * random();
  const noise = o.noise ?? 0.01;
  const runCount = o.runs ?? 1 + Math.floor(random() * 3);
  const readingCount = o.readings ?? 10 + Math.floor(random() * 8);
  const halfLives = o.halfLives ?? 2;
  const absorbance = (o.signal ?? (['path-length', 'transmittance', 'absorptivity-unit', 'end-absorbance'].includes(o.slip) ? 'absorbance' : random() < 0.5 ? 'absorbance' : 'concentration')) === 'absorbance';
  // epsilon in M^-1 cm^-1, l in cm; A_inf where the products absorb. Invented values of a dye's size.
  const epsilonMcm = between(8000, 40000);
  const pathCm = o.slip === 'path-length' || o.slip === 'absorptivity-unit' ? [0.2, 4, 5][Math.floor(random() * 3)] : [1, 0.5, 2][Math.floor(random() * 3)];
  const endAbsorbance = o.slip === 'end-absorbance' ? between(0.1, 0.3) : random() < 0.5 ? between(0.02, 0.2) : 0;
  const order = o.order;
  const k = order === 0 ? between(1e-6, 5e-6) : order === 1 ? between(0.02, 0.2) : between(5, 50) * 100;
  // Absorbances start between 0.6 and 1.2, where a spectrophotometer reads best (common practice, no source).
  const c0s = Array.from({ length: runCount }, () => (absorbance ? between(0.6, 1.2) / (epsilonMcm * pathCm) : between(0.01, 0.1)));
  // Zero order: k scaled to the concentrations so a run takes minutes, not days.
  const kTrue = order === 0 ? k * (absorbance ? 1 : 1000) : order === 2 && !absorbance ? k / 1000 : k;
  const perMolar = absorbance ? epsilonMcm * pathCm : 1;
  const offset = absorbance ? endAbsorbance : 0;
  const runs = c0s.map((c0, r) => {
    const end = timeFor(order, c0, kTrue, halfLives);
    const t = Array.from({ length: readingCount }, (_, i) => Number(((end * i) / (readingCount - 1)).toPrecision(4)));
    const sd = noise * (offset + perMolar * c0);
    const x = t.map((ti) => offset + perMolar * law(order, c0, kTrue, ti) + sd * gaussian(random));
    return { label: `run ${r + 1}`, t, x, c0 };
  });
  const epsilonGiven = o.slip === 'absorptivity-unit' ? { value: Number(written(epsilonMcm / 10, 5)), unit: 'm^2 mol^-1' } : { value: Number(written(epsilonMcm, 5)), unit: 'M^-1 cm^-1' };
  const epsilonUsed = epsilonGiven.unit === 'm^2 mol^-1' ? epsilonGiven.value * 10 : epsilonGiven.value;
  const signal = absorbance
    ? { type: 'absorbance', molarAbsorptivity: epsilonGiven, pathLength: { value: pathCm, unit: 'cm' }, ...(offset !== 0 && { endAbsorbance: Number(offset.toFixed(4)) }) }
    : { type: 'concentration', unit: 'M' };
  const readings = runs.map((run) => run.t.map((t, i) => [t, Number(written(run.x[i], 5))] as [number, number]));
  const offsetGiven = absorbance && offset !== 0 ? Number(offset.toFixed(4)) : 0;
  // The student's concentrations, with the slip of conversion where one is made.
  const toC = (a: number, slip = o.slip): number => {
    if (!absorbance) return a;
    if (slip === 'path-length') return (a - offsetGiven) / epsilonUsed;
    if (slip === 'absorptivity-unit') return (a - offsetGiven) / (epsilonGiven.value * pathCm);
    if (slip === 'end-absorbance') return a / (epsilonUsed * pathCm);
    if (slip === 'transmittance') return 10 ** -a / (epsilonUsed * pathCm);
    return (a - offsetGiven) / (epsilonUsed * pathCm);
  };
  const series = readings.map((rows) => ({ t: rows.map(([t]) => t), c: rows.map(([, a]) => toC(a)) }));
  const wrongOrder: Order = ((order + 1 + Math.floor(random() * 2)) % 3) as Order;
  const reportedOrder = o.slip === 'order-not-supported' ? wrongOrder : order;
  const lawOrder = o.slip === 'other-order-law' ? wrongOrder : reportedOrder;
  let { k: kStudent, se } = studentK(lawOrder, series, o.slip === 'log-base' ? Math.log10 : Math.log);
  if (o.slip === 'sign-flipped') kStudent = -kStudent;
  if (o.slip === 'time-unit') {
    kStudent /= 60;
    se /= 60;
  }
  if (o.slip === 'stoichiometric-k') {
    kStudent /= 2;
    se /= 2;
  }
  if (o.slip === 'transmittance') kStudent = Math.abs(kStudent);
  const unit = o.slip === 'k-unit-order' ? KUNIT[((reportedOrder + 1) % 3) as Order] : KUNIT[reportedOrder];
  const pair = writtenPair(kStudent, se);
  // The same work without the slip: a slip that moves no reported number by more than 3 % cannot be seen.
  const cleanSeries = readings.map((rows) => ({ t: rows.map(([t]) => t), c: rows.map(([, a]) => toC(a, 'none')) }));
  const clean = studentK(order, cleanSeries);
  const halvesOf = (k: number, c: Array<{ c: number[] }>, n: Order) => c.map((run) => halfLife(n, k, run.c[0]));
  const moved = (a: number, b: number) => !(Math.abs(a / b - 1) <= 0.03);
  const cleanHalves = halvesOf(clean.k, cleanSeries, order);
  const halfOrder = o.slip === 'half-life-formula' ? (((reportedOrder + 1) % 3) as Order) : reportedOrder;
  const theirHalves = halvesOf(Number(pair.value), series, halfOrder);
  const visible = o.slip === 'none' || o.slip === 'k-unit-order' || reportedOrder !== order || moved(Number(pair.value), clean.k) || theirHalves.some((h, r) => moved(h, cleanHalves[r]));
  return {
    settings: { kind: 'reaction-order', signal },
    submission: {
      studentId: `G-${o.seed}`,
      runs: runs.map((run, r) => ({
        label: run.label,
        timeUnit: 'min',
        readings: readings[r],
        reported: { halfLife: { value: written(theirHalves[r], 3), unit: 'min' } },
      })),
      reported: { order: reportedOrder, k: { ...pair, unit } },
    },
    trueK: kTrue,
    visible,
  };
}
