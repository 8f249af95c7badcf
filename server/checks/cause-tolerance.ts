import type { NumberLike, Tolerance } from '../../schemas/common.ts';
import { allowance } from './tolerance.ts';
import { lastPlace } from './written-number.ts';

// A slip reproduces its number to about the digits written; 10 % leaves an uncertainty room for a
// student's own rounding of intermediate values (common practice, no source).
const UNCERTAINTY_MATCH = 0.1;
// A value (k) carries more digits: a long-shot slip must reproduce it to 0.05 % or its last place.
const VALUE_MATCH = 0.0005;

/**
 * How close a slip's value must come to a reported uncertainty for that slip to be named. The band
 * that counts an uncertainty as right is wide (25 % by default), and with half a dozen candidates
 * at that width about one chance value in three would match one of them: a cause is named only when
 * the value matches it better than chance would, to 10 % or half a unit in the last place written,
 * and never more loosely than the band for right. `value` is `written` in the comparison's unit.
 */
export function slipMatch(written: NumberLike, value: number, right: Tolerance, relative = UNCERTAINTY_MATCH): Tolerance {
  const halfPlace = 0.5 * lastPlace(written, value);
  return { absolute: Math.min(Math.max(relative * Math.abs(value), halfPlace), allowance(value, right)) };
}

/**
 * How close a long-shot slip (one of dozens of copying variants of x_inf) must bring k: to its
 * last written place or 0.05 %, where a band of 1 % would let one variant or another match a
 * random wrong k often.
 */
export function closeMatch(written: NumberLike, value: number, right: Tolerance): Tolerance {
  return slipMatch(written, value, right, VALUE_MATCH);
}
