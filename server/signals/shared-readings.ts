import { displayStepOf } from './display-step.ts';
import { pairCandidates } from './pair-candidates.ts';
import { fractionAt } from './run-fraction.ts';

/**
 * Data that look alike across a section, where every student measured their own: pairs of
 * submissions whose runs hold the same readings, exactly, after a constant offset, after a change of
 * scale, in another order of runs, or with a few cells edited; and reported rate constants equal to
 * every digit. A prompt for the TA to look and ask, never a finding: honest runs of one experiment
 * agree in shape but not reading by reading, as each carries its own noise.
 *
 * Each run is compared as F_i = (x_i - x_last)/(x_0 - x_last), which an offset or a scale leaves
 * unchanged. Two runs match when at least MATCHING_SHARE of their cells agree to two display steps
 * (relative to the run's amplitude); two submissions are paired when at least MATCHING_RUNS of their
 * runs match a run of the other, in any order.
 */
export const MATCHING_SHARE = 0.75;
export const MATCHING_RUNS = 2;
const STEPS = 2;

export interface SubmittedReadings {
  studentId: string;
  runs: Array<{ label: string; readings: Array<[number, number]> }>;
  /** Reported k of each run as written (string or number), where given. */
  reportedK?: Array<string | number | undefined>;
}

export type Relation = 'identical' | 'offset' | 'scaled' | 'edited';

export interface RunMatch {
  /** Run indices in the first and the second submission. */
  runs: [number, number];
  relation: Relation;
  matchingCells: number;
  cells: number;
}

export interface SharedPair {
  students: [string, string];
  runs: RunMatch[];
  /** Runs whose reported k is written the same, to every digit (4 or more significant figures). */
  sameReportedK: Array<[number, number]>;
}

export interface SharedReport {
  pairs: SharedPair[];
  /** Students linked by pairs, where more than two share. */
  groups: string[][];
}

/**
 * A run as compared. F is not kept beside the readings but worked out from them where it is read
 * (`fractionAt`): on a course-wide file the copy of F was a third of what the comparison held.
 */
interface Prepared {
  x: number[];
  /** The step the readings are written to. */
  step: number;
  /** Two display steps as a share of the run's amplitude. */
  tolerance: number;
}

function prepare(readings: Array<[number, number]>): Prepared | undefined {
  const x = readings.map((r) => Number(r[1]));
  if (x.length < 4 || !x.every(Number.isFinite)) return undefined;
  const span = x[0] - x[x.length - 1];
  if (span === 0) return undefined;
  const step = displayStepOf(x);
  return { x, step, tolerance: (STEPS * step) / Math.abs(span) };
}

function constantWithin(values: number[], tolerance: number): boolean {
  return Math.max(...values) - Math.min(...values) <= tolerance;
}

function compareRuns(a: Prepared, b: Prepared): Omit<RunMatch, 'runs'> | undefined {
  if (a.x.length !== b.x.length) return undefined;
  const tolerance = Math.max(a.tolerance, b.tolerance);
  // Most pairs differ in most cells: stop once too many differ.
  const cells = a.x.length;
  const allowed = cells - Math.ceil(MATCHING_SHARE * cells);
  let differing = 0;
  for (let i = 0; i < cells && differing <= allowed; i++) if (!(Math.abs(fractionAt(a.x, i) - fractionAt(b.x, i)) <= tolerance)) differing++;
  if (differing > allowed) return undefined;
  const matching = cells - differing;
  if (matching === cells) {
    const step = Math.max(a.step, b.step);
    if (a.x.every((v, i) => v === b.x[i])) return { relation: 'identical', matchingCells: cells, cells };
    if (constantWithin(a.x.map((v, i) => b.x[i] - v), 2 * step)) return { relation: 'offset', matchingCells: cells, cells };
    if (a.x.every((v) => v !== 0) && constantWithin(a.x.map((v, i) => b.x[i] / v), 2 * step / Math.min(...a.x.map(Math.abs)))) return { relation: 'scaled', matchingCells: cells, cells };
  }
  return { relation: 'edited', matchingCells: matching, cells };
}

/** A written value with 4 or more significant figures: short values (0.03) are equal by chance. */
function distinctive(value: string | number | undefined): string | undefined {
  if (value === undefined) return undefined;
  const text = String(value).trim();
  const digits = text.split(/e/i)[0].replace(/[^0-9]/g, '').replace(/^0+/, '');
  return digits.length >= 4 ? text : undefined;
}

/**
 * A submission as the comparison reads it: each run prepared, each reported k's distinctive text. It
 * holds none of the submission's own objects, so a section of 20,000 is compared from a compact copy.
 */
export interface PreparedSubmission {
  studentId: string;
  runs: Array<Prepared | undefined>;
  written: Array<string | undefined>;
}

export function prepareSubmission(source: SubmittedReadings): PreparedSubmission {
  return { studentId: source.studentId, runs: source.runs.map((r) => prepare(r.readings)), written: (source.reportedK ?? []).map(distinctive) };
}

function comparePair(pa: PreparedSubmission, pb: PreparedSubmission): SharedPair | undefined {
  const runs: RunMatch[] = [];
  const usedB = new Set<number>();
  pa.runs.forEach((ra, i) => {
    if (!ra) return;
    for (let j = 0; j < pb.runs.length; j++) {
      const rb = pb.runs[j];
      if (!rb || usedB.has(j)) continue;
      const match = compareRuns(ra, rb);
      if (match) {
        runs.push({ runs: [i, j], ...match });
        usedB.add(j);
        return;
      }
    }
  });
  const sameReportedK: Array<[number, number]> = [];
  pa.written.forEach((text, i) => {
    if (text === undefined) return;
    const j = pb.written.indexOf(text);
    if (j >= 0) sameReportedK.push([i, j]);
  });
  if (runs.length < Math.min(MATCHING_RUNS, pa.runs.length, pb.runs.length) && sameReportedK.length < MATCHING_RUNS) return undefined;
  return { students: [pa.studentId, pb.studentId], runs, sameReportedK };
}

/** The full comparison of two submissions, as findSharedReadings makes it for a pair it compares. */
export function sharedPair(a: SubmittedReadings, b: SubmittedReadings): SharedPair | undefined {
  return comparePair(prepareSubmission(a), prepareSubmission(b));
}

/** Connected students, in groups of three or more. */
function groupsOf(pairs: SharedPair[]): string[][] {
  const parent = new Map<string, string>();
  const find = (s: string): string => {
    const p = parent.get(s) ?? s;
    if (p === s) return s;
    const root = find(p);
    parent.set(s, root);
    return root;
  };
  for (const { students } of pairs) parent.set(find(students[0]), find(students[1]));
  const groups = new Map<string, string[]>();
  for (const s of new Set(pairs.flatMap((p) => p.students))) {
    const root = find(s);
    groups.set(root, [...(groups.get(root) ?? []), s]);
  }
  return [...groups.values()].filter((g) => g.length > 2).map((g) => g.sort());
}

export function findSharedReadings(submissions: SubmittedReadings[]): SharedReport {
  return sharedAmong(submissions.map(prepareSubmission));
}

/** The pairs among submissions prepared one at a time (as a long file is read), in the order of all pairs. */
export function sharedAmong(prepared: PreparedSubmission[]): SharedReport {
  // Only pairs that can share anything are compared (see pairCandidates), in the order of all pairs.
  const written = prepared.map((p) => p.written.filter((text) => text !== undefined));
  const pairs: SharedPair[] = [];
  for (const [i, j] of pairCandidates(prepared.map((p) => p.runs), MATCHING_SHARE, written)) {
    const pair = comparePair(prepared[i], prepared[j]);
    if (pair) pairs.push(pair);
  }
  return { pairs, groups: groupsOf(pairs) };
}
