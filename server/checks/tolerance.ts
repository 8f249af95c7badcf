import type { Tolerance } from '../../schemas/common.ts';

/** The allowed difference from an expected value: the larger of the absolute and relative parts. */
export function allowance(expected: number, tolerance: Tolerance): number {
  return Math.max(tolerance.absolute ?? 0, (tolerance.relative ?? 0) * Math.abs(expected));
}

export function withinTolerance(reported: number, expected: number, tolerance: Tolerance): boolean {
  return Math.abs(reported - expected) <= allowance(expected, tolerance) * (1 + 1e-12);
}
