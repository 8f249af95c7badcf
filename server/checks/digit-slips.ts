/**
 * One-slip copies of a number as written: what a reading becomes when one digit is swapped with its
 * neighbour, dropped or doubled, the decimal point moves, or the sign is lost. Used both ways: to name
 * the slip between a class value and a student's copy, and to guess the value a student meant.
 */
export type SlipKind = 'sign-lost' | 'decimal-point' | 'transposed-digits' | 'dropped-digit' | 'extra-digit';

export interface Slip {
  kind: SlipKind;
  value: number;
}

/** The value written with `decimals` places, without sign. */
function digitsOf(value: number, decimals: number): string {
  return Math.abs(value).toFixed(decimals);
}

function signed(text: string, negative: boolean): number {
  const v = Number(text);
  return negative ? -v : v;
}

/** Every one-slip copy of `value` written to `decimals` places, in order of how common the slip is. */
export function oneSlipCopies(value: number, decimals: number): Slip[] {
  const negative = value < 0;
  const text = digitsOf(value, decimals);
  const out: Slip[] = [];
  const add = (kind: SlipKind, t: string) => {
    // The text is digits and at most one point, and a slip keeps it so: only a lone digit dropped
    // leaves no number ("" or ".").
    if (t !== '' && t !== '.') {
      const v = signed(t, negative);
      if (Number.isFinite(v) && v !== value) out.push({ kind, value: v });
    }
  };
  if (value !== 0) out.push({ kind: 'sign-lost', value: -value });
  // Beyond 1e21 toFixed writes an exponent, which has no digits to swap.
  const plain = /^\d+(\.\d*)?$/.test(text);
  // 185.19 x 0.1 is 18.519000000000002 in binary: fifteen significant digits give back the number as written.
  for (const p of [-2, -1, 1, 2]) out.push({ kind: 'decimal-point', value: Number((value * 10 ** p).toPrecision(15)) });
  if (!plain) return out;
  for (let i = 0; i + 1 < text.length; i++) {
    const a = text[i];
    const b = text[i + 1];
    if (a !== b && a !== '.' && b !== '.') add('transposed-digits', text.slice(0, i) + b + a + text.slice(i + 2));
  }
  for (let i = 0; i < text.length; i++) {
    if (text[i] !== '.') add('dropped-digit', text.slice(0, i) + text.slice(i + 1));
  }
  for (let i = 0; i <= text.length; i++) {
    for (const d of '0123456789') add('extra-digit', text.slice(0, i) + d + text.slice(i));
  }
  return out;
}

/** The slip that turns `original` into `copy`, if one slip does. */
export function slipBetween(original: number, copy: number, decimals: number): SlipKind | undefined {
  const scale = Math.max(Math.abs(original), Math.abs(copy), 1);
  return oneSlipCopies(original, decimals).find((s) => Math.abs(s.value - copy) <= 1e-9 * scale)?.kind;
}
