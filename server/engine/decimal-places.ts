/** Decimal places of a number as JavaScript writes it shortest (12.340 -> 3 is lost: 12.34 -> 2). */
export function decimalsOf(value: number): number {
  // Called for every reading of every run: string search, not regular expressions.
  if (Number.isInteger(value) && Math.abs(value) < 1e21) return 0;
  const text = String(Math.abs(value));
  const e = text.indexOf('e');
  const mantissa = e < 0 ? text : text.slice(0, e);
  const dot = mantissa.indexOf('.');
  const places = dot < 0 ? 0 : mantissa.length - dot - 1;
  return Math.max(0, places - (e < 0 ? 0 : Number(text.slice(e + 1))));
}
