import { describe, expect, it } from 'vitest';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { findSharedReadings } from '../../server/signals/shared-readings.ts';
import { asReadings, ownRunsSection } from '../support/own-runs-section.ts';

/**
 * Generated sections (invented data: every student measures their own runs, with realistic noise at
 * 0.001 deg) with and without copied work. Honest sections must raise no pair; each way of copying
 * must be caught in at least 95 of 100 cases.
 */
const round3 = (x: number) => Number(x.toFixed(3));
type Copy = (original: Submission, random: () => number) => Submission;

/** Ways of copying a classmate's readings, each as a copier would disguise them. */
const copies: Record<string, Copy> = {
  identical: (o) => structuredClone(o),
  offset: (o, random) => {
    const c = Math.round((0.5 + random()) * 1000) / 1000;
    const copy = structuredClone(o);
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]) => [t, round3(Number(x) + c)]);
    return copy;
  },
  scaled: (o, random) => {
    const f = 1.1 + random();
    const copy = structuredClone(o);
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]) => [t, round3(Number(x) * f)]);
    return copy;
  },
  'reordered, two cells edited per run': (o, random) => {
    const copy = structuredClone(o);
    copy.runs.reverse();
    for (const run of copy.runs) {
      for (let e = 0; e < 2; e++) {
        const i = 1 + Math.floor(random() * (run.readings.length - 2));
        run.readings[i] = [run.readings[i][0], round3(Number(run.readings[i][1]) + (random() < 0.5 ? -1 : 1) * (0.02 + 0.05 * random()))];
      }
    }
    return copy;
  },
};

describe('readings shared across a section', () => {
  it('raises no pair in honest sections (10 sections of 60)', () => {
    let pairs = 0;
    for (let seed = 1; seed <= 10; seed++) pairs += findSharedReadings(ownRunsSection(seed, 60).map(asReadings)).pairs.length;
    console.log(`honest: ${pairs} pairs among 10 x 1,770 pairs of students`);
    expect(pairs).toBe(0);
  });

  it.each(Object.keys(copies))('finds a copy (%s) in at least 95 of 100 sections, with how the runs match', (how) => {
    let found = 0;
    for (let seed = 100; seed < 200; seed++) {
      const students = ownRunsSection(seed, 12);
      const random = seededRandom(seed);
      const copy = { ...copies[how](students[3], random), studentId: 'S-099' };
      const report = findSharedReadings([...students, copy].map(asReadings));
      const pair = report.pairs.find((p) => p.students[0] === 'S-004' && p.students[1] === 'S-099');
      if (pair && report.pairs.length === 1 && pair.runs.length === copy.runs.length) found++;
    }
    console.log(`${how}: found ${found} of 100`);
    expect(found).toBeGreaterThanOrEqual(95);
  });

  it('names the relation of each matching run and groups three or more who share', () => {
    const students = ownRunsSection(7, 5);
    const offset = structuredClone(students[0]);
    for (const run of offset.runs) run.readings = run.readings.map(([t, x]) => [t, round3(Number(x) + 1.25)]);
    const report = findSharedReadings([...students, { ...structuredClone(students[0]), studentId: 'S-010' }, { ...offset, studentId: 'S-011' }].map(asReadings));
    const byPair = new Map(report.pairs.map((p) => [p.students.join('+'), p.runs.map((r) => r.relation)]));
    expect(byPair.get('S-001+S-010')).toEqual(['identical', 'identical', 'identical', 'identical']);
    expect(byPair.get('S-001+S-011')).toEqual(['offset', 'offset', 'offset', 'offset']);
    expect(report.groups).toEqual([['S-001', 'S-010', 'S-011']]);
  });

  it('pairs reported rate constants written alike to 4 or more figures, not short ones', () => {
    const [a, b] = ownRunsSection(8, 2).map(asReadings);
    const same = (k: Array<string | number>) => findSharedReadings([{ ...a, reportedK: k }, { ...b, reportedK: k }]).pairs;
    expect(same(['0.028731', '0.036512', '0.05'])[0].sameReportedK).toEqual([[0, 0], [1, 1]]);
    expect(same(['0.03', '0.04', '0.05'])).toEqual([]);
  });
});
