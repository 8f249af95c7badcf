import { describe, expect, it } from 'vitest';
import { slipBetween } from '../../server/checks/digit-slips.ts';
import { findSuspectReading } from '../../kinds/first-order-catalysis/checks/suspect-readings.ts';
import { compareTables, type Row } from '../../server/checks/transcription.ts';

describe('naming a copying slip between a value and its copy (3 decimal places)', () => {
  it.each([
    [12.345, 12.354, 'transposed-digits'], // 4 and 5 swapped
    [12.345, 21.345, 'transposed-digits'], // 1 and 2 swapped
    [12.345, 12.35, 'dropped-digit'], // the 4 left out
    [12.345, 1.345, 'dropped-digit'], // the 2 left out... or the decimal point moved? 1.2345 would be the shift
    [12.345, 123.45, 'decimal-point'],
    [12.345, 1.2345, 'decimal-point'],
    [12.345, 12.3455, 'extra-digit'], // a 5 doubled
    [12.345, 112.345, 'extra-digit'],
    [-1.234, 1.234, 'sign-lost'],
    [12.34, 12.304, 'transposed-digits'], // written 12.340, the 4 and 0 swapped: trailing zeros are restored
  ])('%f copied as %f: %s', (original, copy, slip) => {
    expect(slipBetween(original, copy, 3)).toBe(slip);
  });

  it('a change no single slip makes is not named', () => {
    expect(slipBetween(12.345, 12.999, 3)).toBeUndefined();
  });
});

describe('comparing a copied table with the class table', () => {
  const original: Row[] = [
    [0, 22.44],
    [1, 21.611],
    [2, 20.824],
    [3, 20.076],
    [4, 19.365],
    [5, 18.689],
  ];

  it('a clean copy has no slip', () => {
    expect(compareTables(original, original.map((r) => [r[0], r[1]]))).toEqual([]);
  });

  it('one cell: row and slip named', () => {
    const copy = original.map((r): Row => [r[0], r[1]]);
    copy[2] = [2, 20.842];
    expect(compareTables(original, copy)).toEqual([{ kind: 'cell', row: 2, column: 1, original: 20.824, copy: 20.842, detail: 'transposed-digits' }]);
  });

  it('a time cell too', () => {
    const copy = original.map((r): Row => [r[0], r[1]]);
    copy[4] = [44, 19.365];
    expect(compareTables(original, copy)).toMatchObject([{ row: 4, column: 0, detail: 'extra-digit' }]);
  });

  it('a missing row', () => {
    expect(compareTables(original, original.filter((_, i) => i !== 3))).toEqual([{ kind: 'missing-row', row: 3, detail: 'missing-row' }]);
  });

  it('an extra (repeated) row', () => {
    const copy = [...original.slice(0, 2), original[1], ...original.slice(2)];
    expect(compareTables(original, copy)).toEqual([{ kind: 'extra-row', row: 2, detail: 'extra-row' }]);
  });

  it('readings moved up one row against their times from row 2 on', () => {
    const copy = original.map((r, i): Row => [r[0], i < 2 ? r[1] : (original[i + 1] ?? r)[1]]);
    expect(compareTables(original, copy)).toEqual([{ kind: 'row-shift', row: 2, detail: 'row-shift' }]);
  });

  it('readings moved one row with the last time dropped', () => {
    const copy = original.slice(0, -1).map((r, i): Row => [r[0], i < 3 ? r[1] : original[i + 1][1]]);
    expect(compareTables(original, copy)).toEqual([{ kind: 'row-shift', row: 3, detail: 'row-shift' }]);
  });
});

describe('suspect readings on a student own data', () => {
  // Invented run: x = 10 + 12 e^(-0.05 t) deg, t = 0..15 min, with a fixed +-0.002 deg pattern of
  // scatter, rounded to 0.001 deg.
  const times = Array.from({ length: 16 }, (_, i) => i);
  const clean = times.map((t, i) => Math.round((10 + 12 * Math.exp(-0.05 * t) + (i % 3 === 0 ? 0.002 : i % 3 === 1 ? -0.002 : 0)) * 1000) / 1000);

  it('clean data: none', () => {
    expect(findSuspectReading({ times, readings: clean, timeUnit: 'min' })).toBeUndefined();
  });

  it('two digits swapped in reading 7 (x = 18.456 read as 18.546): found, with the value that fits', () => {
    const readings = [...clean];
    const original = readings[7];
    const digits = original.toFixed(3);
    // Swap the first two decimals.
    const swapped = Number(`${digits.slice(0, -3)}${digits[digits.length - 2]}${digits[digits.length - 3]}${digits.slice(-1)}`);
    readings[7] = swapped;
    const found = findSuspectReading({ times, readings, timeUnit: 'min' });
    expect(found).toMatchObject({ index: 7, reading: swapped, intended: { value: original, slip: 'transposed-digits' } });
  });
});
