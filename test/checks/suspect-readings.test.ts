import { describe, expect, it } from 'vitest';
import { findSuspectReading } from '../../server/checks/first-order-catalysis/suspect-readings.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { minutes, syntheticReadings } from '../../server/demo/synthetic-run.ts';

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
