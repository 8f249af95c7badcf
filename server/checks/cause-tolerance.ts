import type { NumberLike, Tolerance } from '../../schemas/common.ts';
import { writtenDecimals } from './sig-figs.ts';
import { allowance } from './tolerance.ts';

// A slip reproduces its number to about the digits written; 10 % leaves room for a student's own
// rounding of intermediate values (common practice, no source).
const SLIP_MATCH = 0.1;

/**
 * How close a slip's value must come to a reported uncertainty for that slip to be named. The band
 * that counts an uncertainty as right is wide (25 % by default), and with half a dozen candidates
 * at that width about one chance value in three would match one of them: a cause is named only when
 * the value matches it better than chance would, to 10 % or half a unit in the last place written,
 * and never more loosely than the band for right. `value` is `written` in the comparison's unit.
 */
export function slipMatch(written: NumberLike, value: number, right: Tolerance): Tolerance {
  const halfPlace = 0.5 * 10 ** -writtenDecimals(written) * Math.abs(value / Number(written) || 1);
  return { absolute: Math.min(Math.max(SLIP_MATCH * Math.abs(value), halfPlace), allowance(value, right)) };
}
