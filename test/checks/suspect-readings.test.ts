import { describe, expect, it } from 'vitest';
import { findSuspectReading, poolScatters } from '../../kinds/first-order-catalysis/checks/suspect-readings.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { gaussian, seededRandom } from '../../server/demo/seeded-random.ts';
import { minutes, syntheticReadings } from '../../server/demo/synthetic-run.ts';
import { cleanSuspectWarnings, transpositionRecall } from '../support/transposed-readings.ts';

// Invented runs: x_0 = 22.44 deg, x_inf = 10.54 deg, k = 0.05 per min, a reading a minute for 15 min,
// noise 0.002 deg, shown to 0.001 deg as a polarimeter displays it.
function run(seed: number) {
  const times = minutes(16);
  const readings = syntheticReadings({ k: 0.05, x0: 22.44, xInf: 10.54, times, noise: 0.002, resolution: 0.001, random: seededRandom(seed) }).map((x) => Number(x.toFixed(3)));
  return { times, readings, timeUnit: 'min' };
}

describe('findSuspectReading', () => {
  it.each([3, 8, 12])('a reading written with the decimal point one place right (reading %i) is named, with the value meant', (index) => {
    const curve = run(40 + index);
    const meant = curve.readings[index];
    // The slip: 15.994 written as 159.94.
    curve.readings[index] = Number((meant * 10).toFixed(2));
    const suspect = findSuspectReading({ ...curve, startK: 0.05 });
    expect(suspect).toMatchObject({ index, reading: curve.readings[index], decimals: 3, intended: { value: meant, slip: 'decimal-point' } });
    expect(Math.abs(suspect!.predicted - meant)).toBeLessThan(0.01);
  });

  it('names nothing in a run with honest scatter', () => {
    for (let seed = 0; seed < 40; seed++) expect(findSuspectReading({ ...run(seed), startK: 0.05 })).toBeUndefined();
  });
});

describe('a copying slip late in a run, near x_inf', () => {
  // Invented runs that reach their plateau: x_inf = 9.4 deg, x_0 = 22 deg, k = 0.3 per min, noise
  // 0.003 deg, to 0.001 deg. One reading in the last four, within a degree of x_inf, has two
  // neighbouring digits swapped 0.05 to 0.1 deg off (9.655 written 9.565).
  const plateau = (seed: number) => {
    const times = minutes(16);
    const readings = syntheticReadings({ k: 0.3, x0: 22, xInf: 9.4, times, noise: 0.003, random: seededRandom(seed) }).map((x) => Number(x.toFixed(3)));
    return { times, readings, timeUnit: 'min' };
  };

  it('is named suspect with the swap undone, in every one of 60 runs', () => {
    let tried = 0;
    for (let seed = 0; seed < 60; seed++) {
      const curve = plateau(seed);
      for (const index of [12, 13, 14, 15]) {
        const meant = curve.readings[index];
        const text = meant.toFixed(3);
        // Swap the first and second decimals: 9.655 -> 9.565.
        const copy = Number(`${text.slice(0, -3)}${text[text.length - 2]}${text[text.length - 3]}${text.slice(-1)}`);
        if (Math.abs(copy - meant) < 0.05 || Math.abs(copy - meant) > 0.1) continue;
        const readings = curve.readings.slice();
        readings[index] = copy;
        const suspect = findSuspectReading({ ...curve, readings });
        expect(suspect, `seed ${seed}, reading ${index}: ${meant} written ${copy}`).toMatchObject({ index, intended: { value: meant, slip: 'transposed-digits' } });
        tried++;
      }
    }
    expect(tried).toBeGreaterThan(40);
  });
});

describe('small transpositions in any position (a corpus of our own, test/support/transposed-readings.ts)', () => {
  // The corpus changes one reading of one run by swapping two neighbouring digits (0.05 to 0.1 deg,
  // scatter 0.002 to 0.006 deg) and knows which: a finding at that reading is the outside truth.
  it('names the changed reading in at least 99 % of 200 submissions, most as a swap', () => {
    const recall = transpositionRecall(0, 200);
    console.log(`small transpositions: ${recall.found}/200 found at the reading changed, ${recall.namedSwap} named as a swap; missed ${JSON.stringify(recall.misses)}`);
    expect(recall.found).toBeGreaterThanOrEqual(198);
    expect(recall.namedSwap).toBeGreaterThanOrEqual(194);
  });

  it('names the changed reading in at least 99 % of 200 submissions whose every run scatters 0.006 deg', () => {
    // The scatter of the corpus: the smallest swap (0.054 deg) is 9 SDs, and a first reading
    // of a steep run is predicted by the others only to 2 or 3 SDs.
    const recall = transpositionRecall(0, 200, [0.006, 0.006]);
    console.log(`small transpositions at 0.006 deg: ${recall.found}/200 found; missed ${JSON.stringify(recall.misses)}`);
    expect(recall.found).toBeGreaterThanOrEqual(198);
  });

  it('names at most 2 readings of 200 clean submissions of the same corpus (800 runs)', () => {
    // Other seeds than the transposed ones, whose runs before the swap are the same. Every warning here
    // is a false alarm; the first reading of a steep run, named where a swap would put it on a curve
    // that is itself uncertain, is one about once in a thousand runs (the bench measures 8,000), so
    // the bound is a rate of 0.25 %, not none.
    const clean = cleanSuspectWarnings(10_000, 200);
    console.log(`clean transposition corpus: ${clean.warnings} suspect-reading warnings on ${clean.runs} runs`);
    expect(clean.warnings).toBeLessThanOrEqual(2);
  });
});

describe('poolScatters', () => {
  it('averages the variances on their degrees of freedom', () => {
    // Worked by hand: sqrt((10 * 0.003^2 + 10 * 0.006^2) / 20) = sqrt(22.5e-6) = 0.0047434.
    expect(poolScatters([{ sd: 0.003, dof: 10 }, { sd: 0.006, dof: 10 }])!.sd).toBeCloseTo(0.0047434, 7);
    expect(poolScatters([{ sd: 0.003, dof: 10 }, { sd: 0.006, dof: 10 }])!.dof).toBe(20);
    expect(poolScatters([{ sd: Number.NaN, dof: 10 }])).toBeUndefined();
  });
});

describe('a reading that turns the run back', () => {
  // Invented plateau runs: x = 9.4 + 12.6 e^(-0.6 t) deg, a reading a minute, scatter 0.004 deg, to
  // 0.001 deg. One of readings 12 to 14 is set 5 SDs (0.020 deg) above the curve, fewer than the 6
  // needed on its own, where it lies more than 3 SDs above the reading before it: the run falls, rises
  // and falls again, which a careful reader circles.
  const noise = 0.004;
  const times = minutes(16);
  const curve = times.map((t) => 9.4 + 12.6 * Math.exp(-0.6 * t));

  it('is named in at least 90 % of the runs where it rises more than 3 SDs over the reading before', () => {
    let tried = 0;
    let named = 0;
    for (let seed = 0; seed < 100; seed++) {
      const random = seededRandom(seed);
      const readings = curve.map((x) => Number((x + noise * gaussian(random)).toFixed(3)));
      const j = 12 + (seed % 3);
      readings[j] = Number((curve[j] + 5 * noise).toFixed(3));
      if (!(readings[j] - readings[j - 1] > 3 * noise)) continue;
      tried++;
      if (findSuspectReading({ times, readings, timeUnit: 'min' })?.index === j) named++;
    }
    expect(tried).toBeGreaterThan(60);
    expect(named / tried).toBeGreaterThanOrEqual(0.9);
  });

  it('is said to turn the run back, in the message of the finding', () => {
    // The same runs checked whole (x_inf 9.400 given): a reading 5 SDs off is named by the turn-back
    // rule alone, and the message says so in words a reader checks against the table (the readings
    // fall; this one is higher than the one before it).
    const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));
    let said = 0;
    for (let seed = 0; seed < 30; seed++) {
      const random = seededRandom(seed);
      const readings = curve.map((x) => Number((x + noise * gaussian(random)).toFixed(3)));
      const j = 12 + (seed % 3);
      readings[j] = Number((curve[j] + 5 * noise).toFixed(3));
      if (!(readings[j] - readings[j - 1] > 3 * noise)) continue;
      const submission = { studentId: 'S-1', runs: [{ label: 'run 1', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: times.map((t, i): [number, number] => [t, readings[i]]), infinity: 9.4 }] };
      const finding = checkSubmission(assignment, submission).findings.find((f) => f.code === 'suspect-reading' && f.path === `runs[0].readings[${j}]`);
      if (finding?.message.includes('turns the run back: the readings fall, but it is higher than the reading before it')) said++;
    }
    expect(said).toBeGreaterThanOrEqual(10);
  });
});

describe('a reading past x_inf', () => {
  // Invented: a run read to its plateau, x = 9.4 + 12.6 e^(-0.6 t) deg, scatter 0.003 deg, to 0.001
  // deg, the student's x_inf 9.400. A reading 0.004 deg past it is the plateau's own scatter (under
  // 3 SDs); one 0.060 deg past it (20 SDs) is a slip to check.
  const times = minutes(16);
  const random = seededRandom(7);
  const readings = times.map((t) => Number((9.4 + 12.6 * Math.exp(-0.6 * t) + 0.003 * gaussian(random)).toFixed(3)));
  const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));
  const submissionWith = (x: number) => {
    const run = readings.map((r, i): [number, number] => [times[i], i === 13 ? x : r]);
    return { studentId: 'S-1', runs: [{ label: 'run 1', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: run, infinity: 9.4 }] };
  };
  const suspectAt13 = (x: number) => checkSubmission(assignment, submissionWith(x)).findings.filter((f) => f.code === 'suspect-reading' && f.path === 'runs[0].readings[13]');

  it('within 3 SDs of the scatter is not named', () => {
    expect(suspectAt13(9.396)).toEqual([]);
  });

  it('far past it is named', () => {
    expect(suspectAt13(9.34)).toHaveLength(1);
  });
});
