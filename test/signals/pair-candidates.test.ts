import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { pairCandidates } from '../../server/signals/pair-candidates.ts';
import { findSharedReadings, MATCHING_SHARE, prepareSubmission, sharedPair, type SharedPair, type SubmittedReadings } from '../../server/signals/shared-readings.ts';
import { asReadings, ownRunsSection } from '../support/own-runs-section.ts';

/**
 * The shared-readings signal compares only the pairs `pairCandidates` lists. These tests hold it to the
 * full comparison of every pair, on generated sections (invented data) salted with near-copies made to
 * sit on every edge the shortcut relies on: readings moved by one to three display steps (F differences
 * around the tolerance), runs with exactly as many edited cells as still match and one more, runs of a
 * tiny amplitude (a tolerance far wider than the others'), runs cut short or too short to compare, and
 * rate constants written alike.
 */
type Readings = SubmittedReadings;
const STEP = 0.001;
const round3 = (x: number) => Number(x.toFixed(3));

function mapRuns(s: Readings, id: string, f: (readings: Array<[number, number]>, run: number) => Array<[number, number]>): Readings {
  return { ...s, studentId: id, runs: s.runs.map((r, i) => ({ ...r, readings: f(r.readings, i) })) };
}

/** Near-copies of classmates' work, each kind several times, with ids N-001, N-002, ... */
function nearCopies(students: Readings[], random: () => number): Readings[] {
  const pick = () => students[Math.floor(random() * students.length)];
  const out: Readings[] = [];
  const id = () => `N-${String(out.length + 1).padStart(3, '0')}`;
  for (let k = 0; k < 4; k++) {
    // Every reading moved by up to `steps` display steps: F moves by about the tolerance.
    for (const steps of [1, 2, 3]) out.push(mapRuns(pick(), id(), (rs) => rs.map(([t, x]) => [t, round3(x + STEP * (Math.floor(random() * (2 * steps + 1)) - steps))])));
    // Two runs copied with `edits` inner cells changed (3 of 16 still match, 4 too, 5 do not), the rest the
    // copier's own; also scaled down, which widens the copy's tolerance so that the pair is judged from
    // the edited side.
    for (const edits of [3, 4, 5]) {
      for (const scale of [1, 0.8]) {
        const from = pick();
        const own = pick();
        out.push({
          ...own,
          studentId: id(),
          runs: own.runs.map((r, i) => {
            if (i > 1) return r;
            const readings = from.runs[i].readings.map(([t, x]) => [t, round3(x * scale)] as [number, number]);
            for (let e = 0; e < edits; e++) readings[1 + e * 3][1] = round3(readings[1 + e * 3][1] + 0.05);
            return { ...r, readings };
          }),
        });
      }
    }
    // Offset, and scale, and runs cut short (another length).
    out.push(mapRuns(pick(), id(), (rs) => rs.map(([t, x]) => [t, round3(x + 0.75)])));
    out.push(mapRuns(pick(), id(), (rs) => rs.map(([t, x]) => [t, round3(x * 1.3)])));
    out.push(mapRuns(pick(), id(), (rs) => rs.slice(0, rs.length - 3)));
  }
  // Runs of a tiny amplitude: a few display steps from end to end, so the tolerance is wide; two such
  // students alike, one copied from them.
  const flat = (s: Readings, seed: number) => mapRuns(s, id(), (rs) => rs.map(([t], i) => [t, round3(10 + STEP * Math.round(6 * Math.exp(-0.1 * i) + seed * random()))]));
  const tiny = flat(pick(), 1);
  out.push(tiny, flat(pick(), 2), { ...tiny, studentId: id() });
  // Too short to compare, and rate constants written alike (one shared, and two).
  out.push(mapRuns(pick(), id(), (rs) => rs.slice(0, 3)));
  const [a, b, c] = [pick(), pick(), pick()];
  out.push({ ...a, studentId: id(), reportedK: ['0.031284', '0.044719', undefined, '0.05'] });
  out.push({ ...b, studentId: id(), reportedK: ['0.031284', '0.044719'] });
  out.push({ ...c, studentId: id(), reportedK: [0.031284] });
  return out;
}

/** Every pair compared in full, in the order of a loop over all pairs. */
function allPairs(section: Readings[]): SharedPair[] {
  const pairs: SharedPair[] = [];
  for (let i = 0; i < section.length; i++) for (let j = i + 1; j < section.length; j++) {
    const pair = sharedPair(section[i], section[j]);
    if (pair) pairs.push(pair);
  }
  return pairs;
}

describe('the pairs compared for shared readings', () => {
  it('give the same report as comparing every pair, on sections salted with near-copies (6 sections of about 100)', () => {
    let found = 0;
    const relations = new Set<string>();
    for (let seed = 1; seed <= 6; seed++) {
      const students = ownRunsSection(seed, 60).map(asReadings);
      const section = [...students, ...nearCopies(students, seededRandom(1000 + seed))];
      const expected = allPairs(section);
      expect(findSharedReadings(section).pairs).toEqual(expected);
      found += expected.length;
      for (const p of expected) for (const r of p.runs) relations.add(r.relation);
    }
    console.log(`near-copies: ${found} pairs reported, relations ${[...relations].sort().join(', ')}`);
    // The salt must reach the comparison's every outcome, or the equality above proves little.
    expect([...relations].sort()).toEqual(['edited', 'identical', 'offset', 'scaled']);
    expect(found).toBeGreaterThan(100);
  });

  it('leave out nearly all pairs of an honest section', () => {
    const section = ownRunsSection(31, 300).map(asReadings);
    const candidates = [...pairCandidates(section.map((s) => prepareSubmission(s).runs), MATCHING_SHARE, section.map(() => []))];
    const all = (section.length * (section.length - 1)) / 2;
    console.log(`honest section of 300: ${candidates.length} of ${all} pairs compared`);
    expect(candidates.length).toBeLessThan(all / 100);
  });
});
