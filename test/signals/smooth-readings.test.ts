import { describe, expect, it } from 'vitest';
import type { Submission } from '../../schemas/kinds/first-order-catalysis.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment, generateSubmission } from '../../server/demo/submission-generator.ts';
import { findSmoothRuns, type RunsOfStudent } from '../../server/signals/smooth-readings.ts';

/**
 * Generated sections (invented data: own runs, noise 0.002 to 0.004 deg, shown to 0.001 deg). Honest
 * runs must never be called smooth; runs computed from a curve and rounded to the display step must be.
 */
const asRuns = (s: Submission): RunsOfStudent => ({
  studentId: s.studentId,
  runs: s.runs.map((r) => ({ label: r.label, timeUnit: r.timeUnit, readings: r.readings.map(([t, x]) => [Number(t), Number(x)] as [number, number]) })),
});

function section(seed: number, students: number): Submission[] {
  const random = seededRandom(seed);
  const settings = generateAssignment(random, { fitModel: 'origin' });
  return Array.from({ length: students }, (_, i) => ({ ...generateSubmission(random, settings, i + 1), studentId: `S-${String(i + 1).padStart(3, '0')}` }));
}

/** A student's runs replaced by a curve through their first and last readings, rounded to 0.001: computed, not read. */
function computed(s: Submission): Submission {
  const copy = structuredClone(s);
  for (const run of copy.runs) {
    const x0 = Number(run.readings[0][1]);
    const xInf = Number(run.infinity);
    const last = run.readings[run.readings.length - 1];
    const k = Math.log((x0 - xInf) / (Number(last[1]) - xInf)) / Number(last[0]);
    run.readings = run.readings.map(([t]) => [t, Number((xInf + (x0 - xInf) * Math.exp(-k * Number(t))).toFixed(3))]);
  }
  return copy;
}

describe('runs smoother than the instrument reads', () => {
  it('are never found in honest sections (10 sections of 60 students, 2,400 runs)', () => {
    let flagged = 0;
    for (let seed = 1; seed <= 10; seed++) flagged += findSmoothRuns(section(seed, 60).map(asRuns)).length;
    console.log(`honest: ${flagged} of 2,400 runs called smooth`);
    expect(flagged).toBe(0);
  });

  it('are found when one student computed their readings, in 100 of 100 sections, every run', () => {
    let found = 0;
    for (let seed = 100; seed < 200; seed++) {
      const students = section(seed, 12);
      students[5] = computed(students[5]);
      const smooth = findSmoothRuns(students.map(asRuns));
      if (smooth.length === students[5].runs.length && smooth.every((r) => r.studentId === 'S-006' && r.residualSD < 0.0005 && r.sectionMedianSD > 0.0015)) found++;
    }
    console.log(`computed: found in ${found} of 100`);
    expect(found).toBe(100);
  });
});
