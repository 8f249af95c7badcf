import { describe, expect, it } from 'vitest';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { findSmoothRuns, type RunsOfStudent } from '../../server/signals/smooth-readings.ts';
import { computedReadings, ownRunsSection } from '../support/own-runs-section.ts';

/**
 * Generated sections (invented data: own runs, noise 0.002 to 0.004 deg, shown to 0.001 deg). Honest
 * runs must never be called smooth; runs computed from a curve and rounded to the display step must be.
 */
const asRuns = (s: Submission): RunsOfStudent => ({
  studentId: s.studentId,
  runs: s.runs.map((r) => ({ label: r.label, timeUnit: r.timeUnit, readings: r.readings.map(([t, x]) => [Number(t), Number(x)] as [number, number]) })),
});

describe('runs smoother than the instrument reads', () => {
  it('are never found in honest sections (10 sections of 60 students, 2,400 runs)', () => {
    let flagged = 0;
    for (let seed = 1; seed <= 10; seed++) flagged += findSmoothRuns(ownRunsSection(seed, 60).map(asRuns)).length;
    console.log(`honest: ${flagged} of 2,400 runs called smooth`);
    expect(flagged).toBe(0);
  });

  it('are found when one student computed their readings, in 100 of 100 sections, every run', () => {
    let found = 0;
    for (let seed = 100; seed < 200; seed++) {
      const students = ownRunsSection(seed, 12);
      students[5] = computedReadings(students[5]);
      const smooth = findSmoothRuns(students.map(asRuns));
      if (smooth.length === students[5].runs.length && smooth.every((r) => r.studentId === 'S-006' && r.residualSD < 0.0005 && r.sectionMedianSD > 0.0015)) found++;
    }
    console.log(`computed: found in ${found} of 100`);
    expect(found).toBe(100);
  });

  it("are found in a student working alone against the instrument's stated noise, and not without it", () => {
    for (let seed = 300; seed < 320; seed++) {
      const alone = [asRuns(computedReadings(ownRunsSection(seed, 1)[0]))];
      // The section is this student alone: their own scatter is the median, so nothing stands out.
      expect(findSmoothRuns(alone)).toEqual([]);
      const found = findSmoothRuns(alone, 0.003);
      expect(found.map((r) => r.run)).toEqual([0, 1, 2, 3]);
      expect(found[0]).toMatchObject({ studentId: 'S-001', instrumentNoise: 0.003 });
    }
  });
});
