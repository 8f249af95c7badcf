/**
 * The pairs of submissions worth comparing for shared readings, found without comparing every pair:
 * a section of n has n(n-1)/2 pairs, and a course-wide file of 20,000 has 200 million. The list is
 * complete: every pair that the full comparison would report is in it (a test compares the two).
 *
 * Two runs of L readings match when at least a share of their F cells agree to within the larger of
 * their two tolerances. F is 1 at the first reading and 0 at the last for every run, so those two cells
 * always agree. For each inner cell the runs of one length are sorted by F there; each run then looks up
 * the runs whose F lies within its own tolerance, cell by cell, and counts the cells each of them agrees
 * on. A pair is counted from the side of the larger tolerance, so the count is the comparison's own:
 * honest runs agree on few cells, and each lookup finds few runs.
 */

import { fractionAt } from './run-fraction.ts';

export interface CandidateRun {
  /** The readings, whose F (see `fractionAt`) is compared. */
  x: number[];
  /** The largest difference in a cell that still counts as agreeing (for a pair, the larger of the two). */
  tolerance: number;
}

/**
 * Submission pairs [i, j], i < j, in the order a loop over all pairs would meet them: those with a run
 * pair that may match, and those with a reported value written alike (`shared` keys, such as a rate
 * constant's exact text, as a submission lists them). Given one at a time from a sorted typed array of
 * keys: a course's 250,000 candidates held as pairs were some 20 MB until the last was compared.
 */
export function* pairCandidates(runs: Array<Array<CandidateRun | undefined>>, matchingShare: number, shared: Array<string[]>): Generator<[number, number]> {
  const n = runs.length;
  const pairs = new Set<number>();
  const add = (a: number, b: number) => {
    if (a !== b) pairs.add(a < b ? a * n + b : b * n + a);
  };
  for (const owners of groupedBy(shared).values()) addAllPairs(owners, add);
  for (const group of runsByLength(runs).values()) addRunCandidates(group, matchingShare, add);
  // Keys below n² are whole numbers that a double holds exactly; a typed array sorts them by value.
  const keys = Float64Array.from(pairs).sort();
  pairs.clear();
  for (const key of keys) yield [Math.floor(key / n), key % n];
}

interface OwnedRun {
  owner: number;
  run: CandidateRun;
}

function runsByLength(runs: Array<Array<CandidateRun | undefined>>): Map<number, OwnedRun[]> {
  const groups = new Map<number, OwnedRun[]>();
  runs.forEach((list, owner) => {
    for (const run of list) {
      if (!run) continue;
      const group = groups.get(run.x.length) ?? [];
      group.push({ owner, run });
      groups.set(run.x.length, group);
    }
  });
  return groups;
}

/** Each key's owners, once each. */
function groupedBy(shared: Array<string[]>): Map<string, number[]> {
  const owners = new Map<string, number[]>();
  shared.forEach((keys, owner) => {
    for (const key of new Set(keys)) owners.set(key, [...(owners.get(key) ?? []), owner]);
  });
  return owners;
}

function addAllPairs(owners: number[], add: (a: number, b: number) => void): void {
  for (let i = 0; i < owners.length; i++) for (let j = i + 1; j < owners.length; j++) add(owners[i], owners[j]);
}

// Rounding in a lookup's bounds must not leave out what the comparison takes as agreeing.
const slack = (value: number, reach: number) => (reach + Math.abs(value)) * 1e-12;

/** Runs of one length whose F agrees on at least `matchingShare` of the cells, counted exactly. */
function addRunCandidates(group: OwnedRun[], matchingShare: number, add: (a: number, b: number) => void): void {
  const length = group[0].run.x.length;
  const count = group.length;
  // The two end cells always agree: the inner ones must make up the share, and at most `spare` may differ.
  const inner = length - 2;
  const needed = Math.ceil(matchingShare * length) - 2;
  const spare = inner - needed;
  if (needed <= 0) {
    addAllPairs(group.map((g) => g.owner), add);
    return;
  }
  // F of the inner cells, one row per run; and per cell, the runs in order of F with those values.
  const f = new Float64Array(count * inner);
  group.forEach((g, r) => {
    for (let c = 0; c < inner; c++) f[r * inner + c] = fractionAt(g.run.x, c + 1);
  });
  const tolerance = Float64Array.from(group, (g) => g.run.tolerance);
  const orders: Int32Array[] = [];
  const sorted: Float64Array[] = [];
  for (let c = 0; c < inner; c++) {
    const order = Int32Array.from(Array.from({ length: count }, (_, r) => r).sort((x, y) => f[x * inner + c] - f[y * inner + c]));
    orders.push(order);
    sorted.push(Float64Array.from(order, (r) => f[r * inner + c]));
  }
  const from = new Int32Array(inner);
  const to = new Int32Array(inner);
  const cellsByRange = Array.from({ length: inner }, (_, c) => c);
  const seenBy = new Int32Array(count).fill(-1);
  for (let a = 0; a < count; a++) {
    const reach = tolerance[a];
    for (let c = 0; c < inner; c++) {
      const fa = f[a * inner + c];
      const wider = reach + slack(fa, reach);
      from[c] = lowerBound(sorted[c], fa - wider);
      to[c] = lowerBound(sorted[c], fa + wider, true);
    }
    // A run that matches run a differs from it in at most `spare` inner cells, so it agrees in one of
    // any spare + 1 of them: the ones where fewest runs lie near run a's value are enough to look in.
    cellsByRange.sort((x, y) => to[x] - from[x] - (to[y] - from[y]));
    for (let pick = 0; pick <= spare; pick++) {
      const c = cellsByRange[pick];
      const order = orders[c];
      for (let k = from[c]; k < to[c]; k++) {
        const b = order[k];
        // Each pair is judged from the side of the larger tolerance (both sides on a tie), as the comparison does.
        if (b === a || seenBy[b] === a || tolerance[b] > reach) continue;
        seenBy[b] = a;
        if (agreeing(f, a * inner, b * inner, inner, reach, spare)) add(group[a].owner, group[b].owner);
      }
    }
  }
}

/** Whether two rows of `inner` cells differ by more than `tolerance` in at most `spare` cells. */
function agreeing(f: Float64Array, rowA: number, rowB: number, inner: number, tolerance: number, spare: number): boolean {
  let differing = 0;
  for (let i = 0; i < inner; i++) if (!(Math.abs(f[rowA + i] - f[rowB + i]) <= tolerance) && ++differing > spare) return false;
  return true;
}

/** The first index whose value is at least `value` (past it, with `past`). */
function lowerBound(values: Float64Array, value: number, past = false): number {
  let low = 0;
  let high = values.length;
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (values[mid] < value || (past && values[mid] === value)) low = mid + 1;
    else high = mid;
  }
  return low;
}
