import { Settings, type Equilibrium, type EquilibriumCode, type Submission, type SubmittedRun } from '../schemas.ts';
import type { ReportedValue } from '../../../schemas/common.ts';
import { toFigures } from '../../../server/demo/careful-rounding.ts';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { analysed, assignmentSettings, assignmentVariants, drawRateLaw, generateRuns, studentId, type AssignmentOptions, type ExpectedFinding, type Random, type RateLaw } from './submission-generator.ts';

/**
 * Seeded submissions with the equilibrium block, clean or with one slip of its arithmetic made in
 * every run, and runs with one end value read early. An invented scenario, not measurements: two
 * forms A and B with invented specific rotations ([α]_A ~ U(70, 130), [α]_B ~ U(5, 40) deg mL g^-1
 * dm^-1), an equilibrium fraction x_B ~ U(0.55, 0.8)
 * (away from 0.5, where swapping the forms, inverting K or swapping k_f and k_r changes nothing a tolerance sees), l = 1 or 2 dm, c ~ U(0.05, 0.15) g/mL (given
 * as g/mL or g/100 mL). Runs start from A a little after dissolving (x_0 at 97-100 % of pure A's
 * rotation) and level off at the equilibrium rotation; rate law and noise as submission-generator.ts.
 *
 * The careful student works each run from its recorded x_inf: [α]_eq = x_inf/(l c) (half of them
 * report it), x_B = ([α]_A − [α]_eq)/([α]_A − [α]_B) to 4 decimals (as a fraction, or as a percentage
 * with %), K = x_B/(1 − x_B), k_f = k K/(1 + K) and k_r = k/(1 + K) from their own k, to 4 figures;
 * the mean K of the runs, and k_N, k_A split with it. The formulas are written out here, apart from
 * the checker's.
 */
export const equilibriumSlipCodes = [
  'anomers-swapped',
  'percent-fraction',
  'inverted-constant',
  'path-length-unit',
  'mass-concentration-unit',
  'start-for-end-value',
  'rate-constants-swapped',
] as const satisfies readonly EquilibriumCode[];
export type EquilibriumSlip = (typeof equilibriumSlipCodes)[number];

const uniform = (random: Random, low: number, high: number): number => low + (high - low) * random();

/** An invented pair of forms, a cell and a solution; with `per100` the concentration is given in g/100 mL. */
export function drawBlock(random: Random, per100 = random() < 0.5): Equilibrium {
  const a = toFigures(uniform(random, 70, 130), 4);
  const b = toFigures(uniform(random, 5, 40), 3);
  const c = toFigures(uniform(random, 0.05, 0.15), 3);
  return {
    pureForms: { A: { value: a, unit: 'deg mL g^-1 dm^-1' }, B: { value: b, unit: 'deg mL g^-1 dm^-1' }, wavelengthNm: 589, temperatureC: 25 },
    pathLength: random() < 0.5 ? { value: 2, unit: 'dm' } : { value: 1, unit: 'dm' },
    concentration: per100 ? { value: toFigures(100 * c, 4), unit: 'g/100 mL' } : { value: c, unit: 'g/mL' },
    startsFrom: 'A',
    tolerances: { specificRotation: { relative: 0.01 }, xB: { absolute: 0.005 }, K: { relative: 0.02 }, kSplit: { relative: 0.02 } },
    rubric: { composition: 1, constant: 1, kSplit: 1, meanK: 1, rateLawSplit: 1 },
  };
}

// The cell's l in dm and c in g/mL, from the units the block gives them in (definitions of the units).
const lDm = (block: Equilibrium): number => block.pathLength.value * { dm: 1, cm: 0.1, mm: 0.01 }[block.pathLength.unit];
const cGPerMl = (block: Equilibrium): number => block.concentration.value * { 'g/mL': 1, 'g/100 mL': 0.01, 'g/L': 0.001 }[block.concentration.unit];

/** The runs of the scenario: every run starts near pure A and levels off at the equilibrium rotation. */
export function scenarioRuns(random: Random, block: Equilibrium, law: RateLaw, xB = uniform(random, 0.55, 0.8)): ReturnType<typeof generateRuns> {
  const lc = lDm(block) * cGPerMl(block);
  const { A, B } = block.pureForms;
  const equilibrium = A.value - xB * (A.value - B.value);
  return generateRuns(random, law, { x0: () => A.value * lc * uniform(random, 0.97, 1), xInf: equilibrium * lc });
}

/** How a student writes the block's values, and which slip (if any) they make in every run. */
export interface Writing {
  rotation: boolean;
  percent: boolean;
  slip?: EquilibriumSlip;
}

const plain = (value: number, unit = ''): ReportedValue => ({ value: String(toFigures(value, 4)), unit });
const kOf = (run: SubmittedRun): number => Number(run.reported!.k!.value);

/** The student's [α] for a run: from x_inf, or with their slip of units or of the value read. */
function studentRotation(run: SubmittedRun, block: Equilibrium, slip: EquilibriumSlip | undefined): number {
  const l = lDm(block) * (slip === 'path-length-unit' ? 10 : 1);
  const c = cGPerMl(block) * (slip === 'mass-concentration-unit' ? 100 : 1);
  const alpha = slip === 'start-for-end-value' ? run.readings[0][1] : run.infinity!;
  return alpha / (l * c);
}

/** Writes the block's values into a clean submission; returns the findings the slip must cause. */
export function writeEquilibrium(submission: Submission, block: Equilibrium, w: Writing): ExpectedFinding[] {
  const { A, B } = block.pureForms;
  const expected: ExpectedFinding[] = [];
  const Ks: number[] = [];
  submission.runs.forEach((run, i) => {
    const rotation = studentRotation(run, block, w.slip);
    let x = (A.value - rotation) / (A.value - B.value);
    if (w.slip === 'anomers-swapped') x = 1 - x;
    let K = x / (1 - x);
    if (w.slip === 'inverted-constant') K = 1 / K;
    Ks.push(K);
    const k = kOf(run);
    let [kf, kr] = [(k * K) / (1 + K), k / (1 + K)];
    if (w.slip === 'rate-constants-swapped') [kf, kr] = [kr, kf];
    // A percentage slip writes the other scale under the unit declared.
    const asPercent = w.percent !== (w.slip === 'percent-fraction');
    run.reported = {
      ...run.reported,
      ...(w.rotation && { specificRotation: plain(rotation, A.unit) }),
      xB: { value: (asPercent ? 100 * x : x).toFixed(asPercent ? 2 : 4), unit: w.percent ? '%' : '' },
      K: plain(K),
      kf: plain(kf, run.reported!.k!.unit),
      kr: plain(kr, run.reported!.k!.unit),
    };
    const at = (field: string): ExpectedFinding => ({ code: w.slip!, path: `runs[${i}].reported.${field}` });
    if (w.slip === 'anomers-swapped' || w.slip === 'percent-fraction') expected.push(at('xB'));
    if (w.slip === 'inverted-constant') expected.push(at('K'));
    if (w.slip === 'rate-constants-swapped') expected.push(at('kf'), at('kr'));
    if (w.slip === 'path-length-unit' || w.slip === 'mass-concentration-unit' || w.slip === 'start-for-end-value') expected.push(at(w.rotation ? 'specificRotation' : 'xB'));
  });
  const meanK = Ks.reduce((s, v) => s + v, 0) / Ks.length;
  const share = meanK / (1 + meanK);
  const kN = Number(submission.reported!.kN!.value);
  const kA = Number(submission.reported!.kA!.value);
  submission.reported = {
    ...submission.reported,
    K: plain(meanK),
    kNf: plain(kN * share, submission.reported!.kN!.unit),
    kNr: plain(kN * (1 - share), submission.reported!.kN!.unit),
    kAf: plain(kA * share, submission.reported!.kA!.unit),
    kAr: plain(kA * (1 - share), submission.reported!.kA!.unit),
  };
  return expected;
}

export interface EquilibriumCase {
  settings: Settings;
  submission: Submission;
  expected: ExpectedFinding[];
}

/** The assignment with the block, and a student's runs of the scenario analysed cleanly. */
function scenario(random: Random, options: AssignmentOptions, per100?: boolean): { settings: Settings; submission: Submission; block: Equilibrium } {
  const block = drawBlock(random, per100);
  const law = drawRateLaw(random);
  const classRuns = options.classDataset ? scenarioRuns(random, block, law) : undefined;
  const settings = Settings.parse({ ...assignmentSettings(options, classRuns), equilibrium: block });
  const runs = structuredClone(settings.classDataset?.runs ?? scenarioRuns(random, block, law));
  return { settings, block, submission: analysed({ studentId: studentId(1), runs }, settings) };
}

/** Seeded case `seed`: clean (no `slip`) or with the slip in every run, over the assignment variants. */
export function equilibriumCase(slip: EquilibriumSlip | undefined, seed: number): EquilibriumCase {
  const random = seededRandom(7_000_000 + 100_000 * (slip ? equilibriumSlipCodes.indexOf(slip) + 1 : 0) + seed);
  const options = assignmentVariants[seed % assignmentVariants.length];
  // c read as g/mL is a slip only where it is given in g/100 mL.
  const { settings, submission, block } = scenario(random, options, slip === 'mass-concentration-unit' ? true : undefined);
  const expected = writeEquilibrium(submission, block, { rotation: random() < 0.5, percent: random() < 0.5, slip });
  return { settings, submission, expected };
}

/**
 * A clean submission but for one run whose end value was read early, after `halfLives` half-lives
 * (3 to 4.5: the reading still short of equilibrium by 5 to 13 % of the change), and analysed with it
 * throughout as the student would. Returns the run's index.
 */
export function earlyEndCase(seed: number): EquilibriumCase & { run: number } {
  const random = seededRandom(8_000_000 + seed);
  const { settings, block } = scenario(random, { fitModel: seed % 2 === 0 ? 'origin' : 'intercept' });
  const law = drawRateLaw(random);
  const runs = scenarioRuns(random, block, law);
  const i = Math.floor(random() * runs.length);
  const run = runs[i];
  const halfLives = uniform(random, 3, 4.5);
  const x0 = run.readings[0][1];
  // Read on a display of 0.001 deg, as the other readings.
  run.infinity = Math.round((run.infinity! + (x0 - run.infinity!) * 2 ** -halfLives) * 1000) / 1000;
  const submission = analysed({ studentId: studentId(1), runs }, settings);
  writeEquilibrium(submission, block, { rotation: false, percent: false });
  return { settings, submission, expected: [], run: i };
}
