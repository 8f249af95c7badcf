import type { NumberLike } from '../../schemas/common.ts';

/**
 * How a reported number is written: where its last significant digit stands and how many significant
 * figures it shows. A string keeps the digits as written; a JSON number is read as its shortest form
 * (what JSON.stringify prints), which has lost any trailing zeros it had. The trailing zeros of an
 * integer (880, 1200) are not counted as significant: written so, they may or may not be (common
 * practice, no source).
 */
export interface WrittenNumber {
  /** Decimal places of the last significant digit shown: 0.0520 -> 4, 12.5 -> 1, 880 -> -1, 1.2e3 -> -2. */
  decimals: number;
  /** Significant figures shown, from the first digit that is not zero: 0.0520 -> 3, 880 -> 2, 0 -> 0. */
  figures: number;
  /**
   * The finest place the digits could have reached, in decimal places: the zeros that may follow
   * unseen (an integer's trailing zeros, or those a JSON number lost) counted too. Infinity for a
   * JSON number, whose lost zeros are unknown.
   */
  finest: number;
}

function readText(text: string): Omit<WrittenNumber, 'finest'> & { exponent: number; fraction: number } {
  const t = text.trim().toLowerCase().replace(/^[-+]/, '');
  const e = t.indexOf('e');
  const mantissa = e < 0 ? t : t.slice(0, e);
  const exponent = e < 0 ? 0 : Number(t.slice(e + 1));
  const dot = mantissa.indexOf('.');
  const digits = mantissa.replace('.', '');
  const fraction = dot < 0 ? 0 : mantissa.length - dot - 1;
  const lead = digits.search(/[1-9]/);
  if (lead < 0) return { decimals: fraction - exponent, figures: 0, exponent, fraction };
  // Without a decimal point, an integer's trailing zeros only hold the place.
  const zerosDropped = dot < 0 ? digits.length - digits.replace(/0+$/, '').length : 0;
  return { decimals: fraction - exponent - zerosDropped, figures: digits.length - lead - zerosDropped, exponent, fraction };
}

export function readWritten(value: NumberLike): WrittenNumber {
  if (typeof value === 'number') {
    const { decimals, figures } = readText(String(Math.abs(value)));
    return { decimals, figures, finest: Number.POSITIVE_INFINITY };
  }
  const { decimals, figures, fraction, exponent } = readText(value);
  return { decimals, figures, finest: fraction - exponent };
}

/** One unit in the last significant place `written` shows, in the unit of `value` (the same number read in another unit). */
export function lastPlace(written: NumberLike, value: number): number {
  return 10 ** -readWritten(written).decimals * Math.abs(value / Number(written) || 1);
}

/** The same for the finest place the digits could have reached with the zeros that may follow unseen: 0 for a JSON number. */
export function finestPlace(written: NumberLike, value: number): number {
  return 10 ** -readWritten(written).finest * Math.abs(value / Number(written) || 1);
}

/** The place of the first significant figure of a positive number: 0.00058 -> 0.0001. */
export function firstFigurePlace(x: number): number {
  // The small lift keeps an exact power of ten (1e-5, whose logarithm may print as -5.000000001) in its own place.
  return 10 ** Math.floor(Math.log10(Math.abs(x)) + 1e-9);
}
