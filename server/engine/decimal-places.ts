/** Decimal places of a number as JavaScript writes it shortest (12.340 -> 3 is lost: 12.34 -> 2). */
export function decimalsOf(value: number): number {
  // Called for every reading of every run, and for every one-slip copy of a suspect reading: writing
  // the number out was 2-3 % of `check --jsonl` in a profile, so the places are found by arithmetic
  // where that is exact, and by string search, not regular expressions, where it is not.
  if (Number.isInteger(value) && Math.abs(value) < 1e21) return 0;
  return placesByScaling(Math.abs(value)) ?? placesOfText(Math.abs(value));
}

/** Past this a scaled value's rounding error could reach half a unit (2^50: a margin below 2^52). */
const EXACT_SCALED = 2 ** 50;

/**
 * The fewest places d such that some decimal with d places reads back as `magnitude`; JavaScript's
 * shortest form has as few digits as can be read back, so the same places where it writes no
 * exponent (1e-6 and up). For a decimal M / 10^d that reads back, magnitude * 10^d lies within far
 * less than half a unit of M below 2^50, so rounding finds M; and M / 10^d is correctly rounded (both
 * exact), so the test holds exactly when such a decimal exists. Undefined beyond that range.
 */
function placesByScaling(magnitude: number): number | undefined {
  if (!(magnitude >= 1e-6)) return undefined;
  for (let places = 1, scale = 10; places <= 20; places++, scale *= 10) {
    const scaled = magnitude * scale;
    if (!(scaled < EXACT_SCALED)) return undefined;
    if (Math.round(scaled) / scale === magnitude) return places;
  }
  return undefined;
}

function placesOfText(magnitude: number): number {
  const text = String(magnitude);
  const e = text.indexOf('e');
  const mantissa = e < 0 ? text : text.slice(0, e);
  const dot = mantissa.indexOf('.');
  const places = dot < 0 ? 0 : mantissa.length - dot - 1;
  return Math.max(0, places - (e < 0 ? 0 : Number(text.slice(e + 1))));
}
