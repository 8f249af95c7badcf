import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { gaussian, seededRandom } from '../../server/demo/seeded-random.ts';

/**
 * A corpus of its own (invented data, not the demo generator's): a student's runs, each x(t) = x_inf +
 * (x_0 - x_inf) e^(-k t) with Gaussian scatter, shown to 0.001 deg as a polarimeter displays it; in
 * some, one reading in any position has two neighbouring digits swapped so that it moves 0.05 to 0.1
 * deg (the tenths and hundredths differing by 1: 0.09; the hundredths and thousandths differing by 6
 * to 9: 0.054 to 0.081). The corpus knows which reading it changed and what it was: that is the truth
 * the checker is judged against.
 *
 * Runs: 12 to 20 readings every 0.5, 1 or 2 min; k such that k t_end is 1 to 6 (many runs reach their
 * plateau); x_0 from 10 to 25 deg, x_inf from -8
 * to 11 deg (sucrose turns negative as it inverts: common practice, no source); scatter SD 0.002 to
 * 0.006 deg unless asked otherwise; x_inf measured with the same scatter.
 */
export const SMALLEST_SWAP = 0.05;
export const LARGEST_SWAP = 0.1;

const uniform = (random: () => number, low: number, high: number) => low + (high - low) * random();

export interface CorpusRun {
  times: number[];
  readings: number[];
  infinity: number;
  noise: number;
}

/** Scatter SD drawn from this range, deg. */
export type NoiseRange = [low: number, high: number];
export const USUAL_NOISE: NoiseRange = [0.002, 0.006];

export function corpusRun(random: () => number, noiseRange: NoiseRange = USUAL_NOISE): CorpusRun {
  const count = 12 + Math.floor(random() * 9);
  const interval = [0.5, 1, 2][Math.floor(random() * 3)];
  const times = Array.from({ length: count }, (_, i) => i * interval);
  const k = uniform(random, 1, 6) / times[count - 1];
  const x0 = uniform(random, 10, 25);
  const xInf = uniform(random, -8, 11);
  const noise = uniform(random, ...noiseRange);
  const shown = (x: number) => Number(x.toFixed(3));
  const readings = times.map((t) => shown(xInf + (x0 - xInf) * Math.exp(-k * t) + noise * gaussian(random)));
  return { times, readings, infinity: shown(xInf + noise * gaussian(random)), noise };
}

/** Every copy of `value` (written to 0.001) with two neighbouring digits swapped that moves it 0.05 to 0.1. */
export function smallSwaps(value: number): number[] {
  const text = Math.abs(value).toFixed(3);
  const out: number[] = [];
  for (let i = 0; i + 1 < text.length; i++) {
    if (text[i] === '.' || text[i + 1] === '.' || text[i] === text[i + 1]) continue;
    const swapped = Number(text.slice(0, i) + text[i + 1] + text[i] + text.slice(i + 2)) * Math.sign(value);
    const moved = Math.abs(swapped - value);
    // A hair of slack for binary arithmetic (0.09 can come out as 0.0900000001).
    if (moved >= SMALLEST_SWAP - 1e-9 && moved <= LARGEST_SWAP + 1e-9) out.push(swapped);
  }
  return out;
}

export interface Transposed {
  run: number;
  index: number;
  original: number;
  copy: number;
}

/** Every small transposition of every reading of `runs`: where a slip could be made. */
function swapsIn(runs: CorpusRun[]): Transposed[] {
  return runs.flatMap((r, run) => r.readings.flatMap((original, index) => smallSwaps(original).map((copy) => ({ run, index, original, copy }))));
}

const CATALYST_M = [0.1, 0.2, 0.3, 0.4];

/** A submission of four runs with x_inf and no reported values (only the readings are judged here). */
export function asSubmission(runs: CorpusRun[], studentId: string): Submission {
  return {
    studentId,
    runs: runs.map((r, i) => ({
      label: `run ${i + 1}`,
      catalyst: { value: CATALYST_M[i % CATALYST_M.length], unit: 'M' },
      timeUnit: 'min',
      readings: r.times.map((t, j): [number, number] => [t, r.readings[j]]),
      infinity: r.infinity,
    })),
  };
}

/** Case `seed`: four runs, and with `transposed` one reading of one of them swapped. */
export function corpusCase(seed: number, transposed: boolean, noise?: NoiseRange): { submission: Submission; slip?: Transposed } {
  const random = seededRandom(seed);
  const runs = CATALYST_M.map(() => corpusRun(random, noise));
  if (!transposed) return { submission: asSubmission(runs, `T-${seed}`) };
  // Every small swap of every reading of every run equally likely; a run whose readings
  // have no such pair of digits (about one in two hundred) is simply passed over.
  const swaps = swapsIn(runs);
  const slip = swaps[Math.floor(random() * swaps.length)];
  runs[slip.run].readings[slip.index] = slip.copy;
  return { submission: asSubmission(runs, `T-${seed}`), slip };
}

/** The first-order assignment the corpus is checked under: the origin model, no class dataset. */
const corpusAssignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));

export interface TranspositionRecall {
  cases: number;
  /** A suspect-reading at the changed reading. */
  found: number;
  /** ... naming two neighbouring digits swapped. */
  namedSwap: number;
  misses: Transposed[];
}

/** Cases `firstSeed` on, one small transposition each, checked; which were found at the reading changed. */
export function transpositionRecall(firstSeed: number, cases: number, noise?: NoiseRange): TranspositionRecall {
  const out: TranspositionRecall = { cases, found: 0, namedSwap: 0, misses: [] };
  for (let seed = firstSeed; seed < firstSeed + cases; seed++) {
    const { submission, slip } = corpusCase(seed, true, noise);
    const at = `runs[${slip!.run}].readings[${slip!.index}]`;
    const finding = checkSubmission(corpusAssignment, submission).findings.find((f) => f.code === 'suspect-reading' && f.path === at);
    if (!finding) out.misses.push(slip!);
    else {
      out.found++;
      if (finding.detail === 'transposed-digits') out.namedSwap++;
    }
  }
  return out;
}

/** Clean cases `firstSeed` on, checked: suspect-reading warnings, and submissions with any. */
export function cleanSuspectWarnings(firstSeed: number, cases: number, noise?: NoiseRange): { cases: number; runs: number; warnings: number; submissions: number } {
  let warnings = 0;
  let submissions = 0;
  let runs = 0;
  for (let seed = firstSeed; seed < firstSeed + cases; seed++) {
    const { submission } = corpusCase(seed, false, noise);
    runs += submission.runs.length;
    const count = checkSubmission(corpusAssignment, submission).findings.filter((f) => f.code === 'suspect-reading').length;
    warnings += count;
    if (count > 0) submissions++;
  }
  return { cases, runs, warnings, submissions };
}
