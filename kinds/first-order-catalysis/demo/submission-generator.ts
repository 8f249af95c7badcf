import { equilibriumCodes, findingCodes, KIND, Settings, type EquilibriumCode, type FindingCode, type RunData, type SettingsInput, type Submission, type SubmittedRun } from '../schemas.ts';
import type { ReportedValue } from '../../../schemas/common.ts';
import type { Finding } from '../../../schemas/result.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { fitLine, fitLineModel, type LineFit, type LineModel } from '../../../server/engine/linear-fit.ts';
import { tCritical95 } from '../../../server/engine/student-t.ts';
import { oneSlipCopies } from '../../../server/checks/digit-slips.ts';
import { minutes, syntheticReadings } from '../../../server/demo/synthetic-run.ts';
import { placesFor, reportedValue, toFigures, toPlaces } from '../../../server/demo/careful-rounding.ts';
import { gaussian, seededRandom } from '../../../server/demo/seeded-random.ts';
import { DEMO_EQUILIBRIUM } from './demo-equilibrium.ts';

/**
 * Seeded generator of realistic submissions for the kind `first-order-catalysis`, clean or with exactly
 * one injected slip. An invented scenario, not measurements: every rate constant, reading and student id
 * is drawn here from the ranges below, and ids are pseudonymous (`S-001`).
 *
 * Clean data: 4 runs at 0.05, 0.10, 0.20, 0.40 M catalyst, a reading every minute for t = 0..15 min,
 * k_obs = k_N + k_A c with k_N ~ U(0.01, 0.03) min^-1 and k_A ~ U(0.15, 0.25) M^-1 min^-1,
 * x_0 ~ U(20, 25) deg, x_inf ~ U(8, 11) deg, Gaussian reading noise of SD ~ U(0.002, 0.004) deg, every
 * reading and x_inf rounded to 0.001 deg (a polarimeter's display resolution: common practice, no source).
 *
 * The clean student: ln F column from their own readings and x_inf, to 4 decimals; k = -slope of the
 * full-precision ln F against t with the assignment's model, value to 4 significant figures and its
 * standard error to 2; k_N and k_A from an ordinary straight line through their reported (rounded) k
 * against c in M, same rounding. A slip is carried forward: whatever the student computes after it is
 * computed from their own wrong numbers.
 */

export type Random = () => number;
// Not slips the generator makes: notes on the refit, findings on data a run or its entry cannot be, and lateness.
const NOT_SLIPS = ['carried-forward', 'refit-note', 'run-not-fitted', 'time-unit-implausible', 'temperature-implausible', 'late-submission'] as const;
// The equilibrium block's slips are made by equilibrium-slips.ts, on assignments that set the block.
export type SlipCode = Exclude<FindingCode, (typeof NOT_SLIPS)[number] | EquilibriumCode>;
const notMadeHere: readonly string[] = [...NOT_SLIPS, ...equilibriumCodes];
export const slipCodes: SlipCode[] = findingCodes.filter((c): c is SlipCode => !notMadeHere.includes(c));

/** A finding the checker must report for an injected slip. */
export interface ExpectedFinding {
  code: FindingCode;
  path: string;
  /** For transcription: which slip (a `transcriptionDetails` entry). */
  detail?: string;
}

export interface Injected {
  submission: Submission;
  expected: ExpectedFinding[];
}

export interface AssignmentOptions {
  fitModel?: LineModel;
  classDataset?: boolean;
  reference?: boolean;
  /** The demo's equilibrium block (invented rotations). */
  equilibrium?: boolean;
}

const CATALYST_M = [0.05, 0.1, 0.2, 0.4];
const TIMES_MIN = minutes(16);
const READING_PLACES = 3;
export const REFERENCE_BANDS = {
  kN: { min: 0.005, max: 0.05, unit: 'min^-1' },
  kA: { min: 0.1, max: 0.4, unit: 'M^-1 min^-1' },
};

// ---------------------------------------------------------------------------------------------------
// Small helpers

const uniform = (random: Random, low: number, high: number): number => low + (high - low) * random();
const indexIn = (random: Random, length: number): number => Math.floor(random() * length);
const pick = <T>(random: Random, items: readonly T[]): T => items[indexIn(random, items.length)];

export const studentId = (n: number): string => `S-${String(n).padStart(3, '0')}`;

const kPath = (run: number) => `runs[${run}].reported.k`;
const lnFPath = (run: number) => `runs[${run}].reported.lnF`;

function kOf(run: SubmittedRun): ReportedValue {
  const k = run.reported?.k;
  if (!k) throw new Error(`run ${run.label} has no reported k to change`);
  return k;
}

function measuredInfinity(run: RunData): number {
  if (run.infinity === undefined) throw new Error(`run ${run.label} has no x_inf; every generated run has one`);
  return run.infinity;
}

// ---------------------------------------------------------------------------------------------------
// Assignment and raw data

/** The assignment settings as an instructor would send them (defaults left to the schema). */
export function assignmentSettings(options: AssignmentOptions = {}, classRuns?: RunData[]): SettingsInput {
  if (options.classDataset && !classRuns) throw new Error('a class dataset needs its runs');
  return {
    kind: KIND,
    fitModel: options.fitModel ?? 'origin',
    units: { k: 'min^-1', kN: 'min^-1', kA: 'M^-1 min^-1' },
    ...(options.classDataset && classRuns ? { classDataset: { runs: classRuns } } : {}),
    ...(options.reference ? { reference: REFERENCE_BANDS } : {}),
    ...(options.equilibrium ? { equilibrium: DEMO_EQUILIBRIUM } : {}),
  };
}

/** Parsed settings; with `classDataset`, freshly drawn class runs that every student then carries. */
export function generateAssignment(random: Random, options: AssignmentOptions = {}): Settings {
  return Settings.parse(assignmentSettings(options, options.classDataset ? generateRuns(random) : undefined));
}

export interface RateLaw {
  kN: number;
  kA: number;
}

export function drawRateLaw(random: Random): RateLaw {
  return { kN: uniform(random, 0.01, 0.03), kA: uniform(random, 0.15, 0.25) };
}

/** The start and end rotations of every run, where a scenario fixes them (else drawn per run). */
export interface RunEnds {
  x0: () => number;
  xInf: number;
}

export function generateRuns(random: Random, law: RateLaw = drawRateLaw(random), ends?: RunEnds): RunData[] {
  return CATALYST_M.map((c) => generateRun(random, c, law.kN + law.kA * c, ends));
}

function generateRun(random: Random, concentration: number, k: number, ends?: RunEnds): RunData {
  for (;;) {
    const x0 = ends ? ends.x0() : uniform(random, 20, 25);
    const xInf = ends ? ends.xInf : uniform(random, 8, 11);
    const noise = uniform(random, 0.002, 0.004);
    const xs = syntheticReadings({ k, x0, xInf, times: TIMES_MIN, noise, random }).map((x) => toPlaces(x, READING_PLACES));
    const infinity = toPlaces(xInf + noise * gaussian(random), READING_PLACES);
    // A reading at or past the end value leaves ln F undefined; only very fast runs (the implausible
    // scenario) come that close, and there the run is drawn again as a student would repeat it.
    if (xs.every((x) => (x - infinity) / (xs[0] - infinity) > 0)) {
      return {
        label: `${concentration.toFixed(2)} M`,
        catalyst: { value: concentration, unit: 'M' },
        timeUnit: 'min',
        readings: TIMES_MIN.map((t, i): [number, number] => [t, xs[i]]),
        infinity,
      };
    }
  }
}

// ---------------------------------------------------------------------------------------------------
// The student's analysis

/** ln F (or log10 F) of every reading; null where F <= 0, a cell the student leaves blank. */
function fColumn(run: RunData, infinity: number, log: (f: number) => number = Math.log): Array<number | null> {
  const x0 = run.readings[0][1];
  return run.readings.map(([, x]) => {
    // Same arithmetic as the engine's firstOrderTransform, so a clean k equals the engine's refit.
    const f = (x - infinity) / (x0 - infinity);
    return f > 0 ? log(f) : null;
  });
}

/** The column against time since the first reading (or, swapped, time against the column), filled cells only. */
function fitColumn(run: RunData, column: Array<number | null>, model: LineModel, swapped = false): LineFit {
  const t0 = run.readings[0][0];
  const t: number[] = [];
  const y: number[] = [];
  column.forEach((v, i) => {
    if (v === null) return;
    t.push(run.readings[i][0] - t0);
    y.push(v);
  });
  return swapped ? fitLineModel(model, y, t) : fitLineModel(model, t, y);
}

function setColumn(run: SubmittedRun, column: Array<number | null>): void {
  run.reported = { ...run.reported, lnF: column.map((v) => (v === null ? null : toPlaces(v, 4))) };
}

function setK(run: SubmittedRun, value: number, uncertainty: number, unit: string): void {
  run.reported = { ...run.reported, k: reportedValue(value, uncertainty, unit) };
}

interface RunMethod {
  model?: LineModel;
  infinity?: number;
  log?: (f: number) => number;
}

/** One run as the student analyses it: column, fit, k = -slope with its standard error. */
function analyseRun(run: SubmittedRun, settings: Settings, method: RunMethod = {}): LineFit {
  const column = fColumn(run, method.infinity ?? measuredInfinity(run), method.log);
  const line = fitColumn(run, column, method.model ?? settings.fitModel);
  setColumn(run, column);
  setK(run, -line.slope, line.seSlope, settings.units.k);
  return line;
}

/**
 * The x_inf a student uses by mistake: half the time the last reading, otherwise the recorded x_inf
 * with one copying slip (digits swapped or dropped, the decimal point moved) that leaves every ln F
 * defined and moves k by more than 5 %.
 */
function wrongInfinity(run: SubmittedRun, settings: Settings, random: Random): number {
  const last = run.readings[run.readings.length - 1][1];
  if (random() < 0.5) return last;
  const recorded = measuredInfinity(run);
  const x0 = run.readings[0][1];
  const k = -refitRun(run, settings.fitModel).slope;
  const copies = oneSlipCopies(recorded, READING_PLACES).filter((c) => {
    if (!['transposed-digits', 'dropped-digit', 'decimal-point'].includes(c.kind)) return false;
    if (!run.readings.every(([, x]) => (x - c.value) / (x0 - c.value) > 0)) return false;
    const slipped = -fitColumn(run, fColumn(run, c.value), settings.fitModel).slope;
    return Math.abs(slipped / k - 1) > 0.05;
  });
  return copies.length ? pick(random, copies).value : last;
}

/** The assignment's refit of a run from its readings, without touching what the student reported. */
function refitRun(run: RunData, model: LineModel): LineFit {
  return fitColumn(run, fColumn(run, measuredInfinity(run)), model);
}

/** The second stage from the student's reported k values: an ordinary line of k against c x `scale`. */
function reportRateLaw(submission: Submission, settings: Settings, concentrationScale = 1): void {
  const line = fitLine(
    submission.runs.map((run) => run.catalyst.value * concentrationScale),
    submission.runs.map((run) => Number(kOf(run).value)),
  );
  submission.reported = {
    kN: reportedValue(line.intercept, line.seIntercept, settings.units.kN),
    kA: reportedValue(line.slope, line.seSlope, settings.units.kA),
  };
}

export function analysed(submission: Submission, settings: Settings): Submission {
  for (const run of submission.runs) analyseRun(run, settings);
  reportRateLaw(submission, settings);
  return submission;
}

/** A clean submission: the class runs when the assignment hands them out, else freshly drawn ones. */
export function generateSubmission(random: Random, settings: Settings, n: number): Submission {
  const runs = structuredClone(settings.classDataset?.runs ?? generateRuns(random));
  return analysed({ studentId: studentId(n), runs }, settings);
}

// ---------------------------------------------------------------------------------------------------
// One-slip copies of a reading written with 3 decimals

export const cellSlipKinds = ['transposed-digits', 'dropped-digit', 'extra-digit', 'decimal-point', 'sign-lost'] as const;
export type CellSlipKind = (typeof cellSlipKinds)[number];
const rowSlipKinds = ['row-shift', 'missing-row', 'extra-row'] as const;
type RowSlipKind = (typeof rowSlipKinds)[number];

interface CellCopy {
  kind: CellSlipKind;
  value: number;
}

/** Every copy of `x` that one slip makes: two adjacent differing digits swapped, a digit dropped or
 * added (doubled or any other), the point moved one place, the sign lost. */
function cellCopies(x: number): CellCopy[] {
  const text = Math.abs(x).toFixed(READING_PLACES);
  const sign = x < 0 ? -1 : 1;
  const out: CellCopy[] = [{ kind: 'sign-lost', value: -x }];
  const add = (kind: CellSlipKind, copy: string) => {
    if (/^(\d+\.?\d*|\.\d+)$/.test(copy)) out.push({ kind, value: sign * Number(copy) });
  };
  const dot = text.indexOf('.');
  const digits = text.replace('.', '');
  for (const at of [dot - 1, dot + 1]) add('decimal-point', `${digits.slice(0, at)}.${digits.slice(at)}`);
  for (let i = 0; i + 1 < text.length; i++) {
    const [a, b] = [text[i], text[i + 1]];
    if (a !== b && a !== '.' && b !== '.') add('transposed-digits', text.slice(0, i) + b + a + text.slice(i + 2));
  }
  for (let i = 0; i < text.length; i++) if (text[i] !== '.') add('dropped-digit', text.slice(0, i) + text.slice(i + 1));
  for (let i = 0; i <= text.length; i++) {
    for (const d of '0123456789') add('extra-digit', text.slice(0, i) + d + text.slice(i));
  }
  return out.filter((c) => c.value !== x);
}

/** The copies of `x` that only one kind of slip explains, so that the slip's name is well defined. */
function unambiguousCopies(x: number): CellCopy[] {
  const copies = cellCopies(x);
  return copies.filter((c) => copies.every((o) => o.kind === c.kind || Math.abs(o.value - c.value) > 1e-9 * Math.abs(c.value)));
}

type Readings = RunData['readings'];

/**
 * A row-level slip in a copied table of [t, x] rows; times are never changed.
 * - row-shift: from row `row` on (1 <= row <= n-3, so at least 3 rows differ) each time gets the x of
 *   the row above, i.e. x of row-1 is written twice and the last x falls off; n rows kept.
 * - missing-row: row `row` left out (n-1 rows).
 * - extra-row: row `row` written twice, the copy right after it (n+1 rows; the time repeats).
 */
function rowSlip(readings: Readings, kind: RowSlipKind, random: Random): Readings {
  const n = readings.length;
  if (kind === 'row-shift') {
    const from = 1 + indexIn(random, n - 3);
    return readings.map(([t, x], r): [number, number] => [t, r < from ? x : readings[r - 1][1]]);
  }
  const row = indexIn(random, n);
  const copy = readings.map((r): [number, number] => [r[0], r[1]]);
  if (kind === 'missing-row') copy.splice(row, 1);
  else copy.splice(row + 1, 0, [...readings[row]]);
  return copy;
}

/** The readings with row j's x replaced. */
const withReading = (readings: Readings, j: number, x: number): Readings =>
  readings.map(([t, v], r): [number, number] => [t, r === j ? x : v]);

/** The run re-analysed from changed readings, or undefined when too few F > 0 remain to fit. */
function reanalysed(run: SubmittedRun, readings: Readings, settings: Settings): SubmittedRun | undefined {
  const copy = { ...structuredClone(run), readings };
  try {
    analyseRun(copy, settings);
    return copy;
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

// ---------------------------------------------------------------------------------------------------
// Slips

interface SlipContext {
  submission: Submission;
  random: Random;
  settings: Settings;
}

type Slip = (context: SlipContext) => ExpectedFinding[];

function requires(code: SlipCode, ok: boolean, what: string): void {
  if (!ok) throw new Error(`the slip ${code} needs an assignment with ${what}`);
}

/** Each run's path, for slips made in every run. */
const everyRun = (submission: Submission, path: (i: number) => string, code: FindingCode): ExpectedFinding[] =>
  submission.runs.map((_, i) => ({ code, path: path(i) }));

const LOG_FACTORS = [Math.LN10, 1 / Math.LN10, Math.LN2, 1 / Math.LN2];
const SCALE_FACTORS = [-1, 10, 0.1, 100, 0.01, 1000, 0.001, 60, 1 / 60, 3600, 1 / 3600, ...LOG_FACTORS];

/** Values a checker could name a cause for, for a run's k: the refit k (either model) times up to two
 * common factors; the swapped-axes and half-life values and the k from a wrong x_inf (the last reading
 * or any run's x_inf) times up to one. */
function explainedValues(run: RunData, infinities: number[]): number[] {
  const column = fColumn(run, measuredInfinity(run));
  const wrongInfinities = [run.readings[run.readings.length - 1][1], ...infinities.filter((x) => x !== run.infinity)];
  const one = [1, ...SCALE_FACTORS];
  const two = [...one, ...SCALE_FACTORS.flatMap((a, i) => SCALE_FACTORS.slice(i + 1).map((b) => a * b))];
  return (['origin', 'intercept'] as const).flatMap((model) => {
    const k = -fitColumn(run, column, model).slope;
    const slipped = [Math.LN2 / k, -fitColumn(run, column, model, true).slope, ...wrongInfinities.flatMap((x) => kWithInfinity(run, x, model))];
    return [...two.map((f) => k * f), ...slipped.flatMap((v) => one.map((f) => v * f))];
  });
}

/** k from ln F with another x_inf, or nothing when that x_inf leaves too few F > 0 to fit. */
function kWithInfinity(run: RunData, infinity: number, model: LineModel): number[] {
  try {
    return [-fitColumn(run, fColumn(run, infinity), model).slope];
  } catch (error) {
    if (error instanceof EngineError) return [];
    throw error;
  }
}

/** k times a factor in [1.25, 1.6] or [0.62, 0.8] that lands at least 3 % from every explained value. */
function unexplainedValue(run: SubmittedRun, infinities: number[], random: Random): number {
  const explained = explainedValues(run, infinities);
  const k = Number(kOf(run).value);
  // A few draws suffice: the explained values leave most of both ranges free.
  for (let attempt = 0; attempt < 1000; attempt++) {
    const factor = random() < 0.5 ? uniform(random, 1.25, 1.6) : uniform(random, 0.62, 0.8);
    const value = toFigures(k * factor, 4);
    if (explained.every((e) => Math.abs(value - e) > 0.03 * Math.abs(e))) return value;
  }
  throw new Error(`no unexplained factor found for run ${run.label}`);
}

const UNPARSEABLE_RATE_UNITS = ['per minnit', 'permin', '1/minz', 'mn^-1'];

/** A k reported as strings with one rounding fault: the value 2 places past its uncertainty's last
 * digit, or the uncertainty to 4 significant figures (the value rounded to its 2-figure place). */
function badlyRounded(k: number, se: number, random: Random): [value: string, uncertainty: string] {
  const places = placesFor(se, 2);
  if (random() < 0.5) return [k.toFixed(places + 2), se.toFixed(places)];
  return [k.toFixed(places), se.toFixed(placesFor(se, 4))];
}

const slips: Record<SlipCode, Slip> = {
  /** One run's k reported as the slope (negative); or, half the time, k_A with its sign flipped. */
  'sign-flipped': ({ submission, random, settings }) => {
    if (random() < 0.5) {
      const kA = submission.reported!.kA!;
      kA.value = -Number(kA.value);
      return [{ code: 'sign-flipped', path: 'reported.kA' }];
    }
    const i = indexIn(random, submission.runs.length);
    const k = kOf(submission.runs[i]);
    k.value = -Number(k.value);
    reportRateLaw(submission, settings);
    return [{ code: 'sign-flipped', path: kPath(i) }];
  },

  /** log10 everywhere: the column is log10 F, k = -(slope of log10 F) = k / ln 10, and so on. */
  'log-base': ({ submission, settings }) => {
    for (const run of submission.runs) analyseRun(run, settings, { log: Math.log10 });
    reportRateLaw(submission, settings);
    return everyRun(submission, lnFPath, 'log-base');
  },

  /** Runs timed in seconds (0, 60, ..., 900 s, same readings); k per second declared as min^-1. */
  'time-unit': ({ submission, settings }) => {
    requires('time-unit', !settings.classDataset, 'no class dataset (its times are in minutes)');
    for (const run of submission.runs) {
      run.timeUnit = 's';
      run.readings = run.readings.map(([t, x]): [number, number] => [t * 60, x]);
      analyseRun(run, settings);
    }
    reportRateLaw(submission, settings);
    return everyRun(submission, kPath, 'time-unit');
  },

  /** Second stage with c in mM, k_A declared per M: k_A and its SE 1000 times too small. */
  'concentration-unit': ({ submission, settings }) => {
    reportRateLaw(submission, settings, 1000);
    return [{ code: 'concentration-unit', path: 'reported.kA' }];
  },

  /** One run's k times 10 or 0.1, its uncertainty unchanged. */
  'decimal-shift': ({ submission, random, settings }) => {
    const i = indexIn(random, submission.runs.length);
    const k = kOf(submission.runs[i]);
    k.value = toFigures(Number(k.value) * pick(random, [10, 0.1]), 4);
    reportRateLaw(submission, settings);
    return [{ code: 'decimal-shift', path: kPath(i) }];
  },

  /** Every run: t fitted against ln F (assignment's model), k = -slope and that slope's SE. */
  'swapped-axes': ({ submission, settings }) => {
    for (const run of submission.runs) {
      const line = fitColumn(run, fColumn(run, measuredInfinity(run)), settings.fitModel, true);
      setK(run, -line.slope, line.seSlope, settings.units.k);
    }
    reportRateLaw(submission, settings);
    return everyRun(submission, kPath, 'swapped-axes');
  },

  /** One run analysed with its last reading as x_inf (last ln F blank); the submitted x_inf is kept. */
  'wrong-infinity': ({ submission, random, settings }) => {
    const i = indexIn(random, submission.runs.length);
    const run = submission.runs[i];
    analyseRun(run, settings, { infinity: wrongInfinity(run, settings, random) });
    reportRateLaw(submission, settings);
    return [{ code: 'wrong-infinity', path: lnFPath(i) }];
  },

  /** An origin assignment fitted with an intercept in every run (k and SE from that model). */
  'fit-model': ({ submission, settings }) => {
    requires('fit-model', settings.fitModel === 'origin', 'fitModel origin');
    for (const run of submission.runs) analyseRun(run, settings, { model: 'intercept' });
    reportRateLaw(submission, settings);
    return everyRun(submission, kPath, 'fit-model');
  },

  /** One run reports its half-life ln 2 / k (min, with its propagated SE) as k, unit still min^-1. */
  'half-life-for-rate': ({ submission, random, settings }) => {
    const i = indexIn(random, submission.runs.length);
    const run = submission.runs[i];
    const line = refitRun(run, settings.fitModel);
    const k = -line.slope;
    setK(run, Math.LN2 / k, (Math.LN2 * line.seSlope) / (k * k), settings.units.k);
    reportRateLaw(submission, settings);
    return [{ code: 'half-life-for-rate', path: kPath(i) }];
  },

  /** Every run's uncertainty: the residual SD of ln F about the line, or the 95 % half-width t x SE. */
  'uncertainty-kind': ({ submission, random, settings }) => {
    const residualSD = random() < 0.5;
    for (const run of submission.runs) {
      const line = refitRun(run, settings.fitModel);
      kOf(run).uncertainty = toFigures(residualSD ? line.residualSD : tCritical95(line.dof) * line.seSlope, 2);
    }
    return everyRun(submission, (i) => `${kPath(i)}.uncertainty`, 'uncertainty-kind');
  },

  /** One class reading mis-copied (one cell, or a row slip); the run re-analysed from the copy. */
  transcription: ({ submission, random, settings }) => {
    requires('transcription', settings.classDataset !== undefined, 'a class dataset');
    for (;;) {
      const i = indexIn(random, submission.runs.length);
      const run = submission.runs[i];
      const kind = pick(random, [...cellSlipKinds, ...rowSlipKinds]);
      let readings: Readings;
      let expected: ExpectedFinding;
      if ((rowSlipKinds as readonly string[]).includes(kind)) {
        readings = rowSlip(run.readings, kind as RowSlipKind, random);
        expected = { code: 'transcription', path: `runs[${i}].readings`, detail: kind };
      } else {
        const j = indexIn(random, run.readings.length);
        const copies = unambiguousCopies(run.readings[j][1]).filter((c) => c.kind === kind);
        if (copies.length === 0) continue;
        readings = withReading(run.readings, j, pick(random, copies).value);
        expected = { code: 'transcription', path: `runs[${i}].readings[${j}]`, detail: kind };
      }
      const changed = reanalysed(run, readings, settings);
      if (!changed) continue;
      submission.runs[i] = changed;
      reportRateLaw(submission, settings);
      return [expected];
    }
  },

  /** One reading (not first, not last) changed by one slip of its digits, by at least 0.05 deg. */
  'suspect-reading': ({ submission, random, settings }) => {
    requires('suspect-reading', !settings.classDataset, 'no class dataset');
    for (;;) {
      const i = indexIn(random, submission.runs.length);
      const run = submission.runs[i];
      const j = 1 + indexIn(random, run.readings.length - 2);
      const x = run.readings[j][1];
      const kind = pick(random, cellSlipKinds);
      const copies = unambiguousCopies(x).filter((c) => c.kind === kind && Math.abs(c.value - x) >= 0.05);
      if (copies.length === 0) continue;
      const value = pick(random, copies).value;
      const changed = reanalysed(run, withReading(run.readings, j, value), settings);
      if (!changed) continue;
      submission.runs[i] = changed;
      reportRateLaw(submission, settings);
      return [{ code: 'suspect-reading', path: `runs[${i}].readings[${j}]` }];
    }
  },

  /** Data drawn afresh with k_A = 3 x the band's maximum (band in M^-1 min^-1), analysed cleanly. */
  implausible: ({ submission, random, settings }) => {
    const band = settings.reference?.kA;
    requires('implausible', band !== undefined && !settings.classDataset, 'a k_A reference band and no class dataset');
    submission.runs = generateRuns(random, { kN: uniform(random, 0.01, 0.03), kA: 3 * band!.max });
    analysed(submission, settings);
    return [{ code: 'implausible', path: 'reported.kA' }];
  },

  /** One run's k as strings: value over-precise for its uncertainty, or the uncertainty to 4 figures. */
  'sig-figs': ({ submission, random, settings }) => {
    const i = indexIn(random, submission.runs.length);
    const line = refitRun(submission.runs[i], settings.fitModel);
    const [value, uncertainty] = badlyRounded(-line.slope, line.seSlope, random);
    submission.runs[i].reported!.k = { value, uncertainty, unit: settings.units.k };
    reportRateLaw(submission, settings);
    return [{ code: 'sig-figs', path: kPath(i) }];
  },

  /** One run's k unit replaced by text no unit grammar reads. */
  'unit-unrecognised': ({ submission, random }) => {
    const i = indexIn(random, submission.runs.length);
    kOf(submission.runs[i]).unit = pick(random, UNPARSEABLE_RATE_UNITS);
    return [{ code: 'unit-unrecognised', path: kPath(i) }];
  },

  /** One run's catalyst concentration given as a normality (N, or mN with the value in mM). */
  'unit-assumed': ({ submission, random }) => {
    const i = indexIn(random, submission.runs.length);
    const catalyst = submission.runs[i].catalyst;
    submission.runs[i].catalyst = random() < 0.5 ? { ...catalyst, unit: 'N' } : { value: Number((catalyst.value * 1000).toPrecision(12)), unit: 'mN' };
    return [{ code: 'unit-assumed', path: `runs[${i}].catalyst.unit` }];
  },

  'missing-value': ({ submission }) => {
    delete submission.reported!.kA;
    return [{ code: 'missing-value', path: 'reported.kA' }];
  },

  /** One run's k times a factor that no named slip explains; uncertainty unchanged. */
  unexplained: ({ submission, random, settings }) => {
    const i = indexIn(random, submission.runs.length);
    const infinities = submission.runs.map(measuredInfinity);
    kOf(submission.runs[i]).value = unexplainedValue(submission.runs[i], infinities, random);
    reportRateLaw(submission, settings);
    return [{ code: 'unexplained', path: kPath(i) }];
  },
};

/**
 * The clean `submission` with exactly one slip of kind `code`, everything downstream recomputed from
 * the student's own wrong numbers, and the findings a checker must report for it. The input is not
 * changed. Throws when the assignment cannot hold the slip (see each slip's `requires`).
 */
export function inject(code: SlipCode, submission: Submission, random: Random, settings: Settings): Injected {
  const copy = structuredClone(submission);
  const expected = slips[code]({ submission: copy, random, settings });
  return { submission: copy, expected };
}

// ---------------------------------------------------------------------------------------------------
// Cases for tests and benches

/** Options a slip needs; others vary with the seed so that every slip meets every assignment it can. */
const REQUIRED_OPTIONS: Partial<Record<SlipCode, AssignmentOptions>> = {
  'fit-model': { fitModel: 'origin' },
  'time-unit': { classDataset: false },
  transcription: { classDataset: true },
  'suspect-reading': { classDataset: false },
  implausible: { reference: true, classDataset: false },
};

export function caseOptions(code: SlipCode, seed: number): AssignmentOptions {
  return {
    fitModel: seed % 2 === 0 ? 'origin' : 'intercept',
    classDataset: seed % 4 >= 2,
    reference: seed % 8 >= 4,
    ...REQUIRED_OPTIONS[code],
  };
}

export interface Case extends Injected {
  settings: Settings;
}

/** Seeded case `seed` of slip `code`: its own assignment, one student (S-<seed+1>), the slip. */
export function slipCase(code: SlipCode, seed: number): Case {
  const random = seededRandom(100_000 * (slipCodes.indexOf(code) + 1) + seed);
  const settings = generateAssignment(random, caseOptions(code, seed));
  const clean = generateSubmission(random, settings, seed + 1);
  return { settings, ...inject(code, clean, random, settings) };
}

/** The eight assignment variants: fit model x class dataset x reference band. */
export const assignmentVariants: AssignmentOptions[] = (['origin', 'intercept'] as const).flatMap((fitModel) =>
  [false, true].flatMap((classDataset) => [false, true].map((reference) => ({ fitModel, classDataset, reference }))),
);

/** Seeded clean case `seed`, cycling through the assignment variants. */
export function cleanCase(seed: number): { settings: Settings; submission: Submission } {
  const random = seededRandom(seed);
  const settings = generateAssignment(random, assignmentVariants[seed % assignmentVariants.length]);
  return { settings, submission: generateSubmission(random, settings, seed + 1) };
}

/** A finding's path answers an expected one: the same path, or for fit-model any path under it
 * (`runs[i].reported.k.uncertainty` answers `runs[i].reported.k`). */
export function atExpectedPath(expected: ExpectedFinding, path: string): boolean {
  return expected.code === 'fit-model' ? path.startsWith(expected.path) : path === expected.path;
}

/** Whether `findings` hold `expected`: its code (or among alsoCodes), its path, and its detail if any. */
export function isFound(expected: ExpectedFinding, findings: readonly Finding[]): boolean {
  return findings.some(
    (f) =>
      (f.code === expected.code || (f.alsoCodes ?? []).includes(expected.code)) &&
      atExpectedPath(expected, f.path) &&
      (expected.detail === undefined || f.detail === expected.detail),
  );
}
