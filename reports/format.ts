import type { NumberLike } from '../schemas/common.ts';
import type { Tolerance } from '../schemas/common.ts';

/**
 * Number and unit text as printed on the sheets: the true minus sign (U+2212), powers of ten and unit
 * exponents as superscripts. Tests format with the same functions to find the printed figures.
 */

export const MINUS = '\u2212';

const SUPERSCRIPTS: Record<string, string> = {
  '-': '⁻', '+': '⁺', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

export function superscript(text: string): string {
  return [...text].map((c) => SUPERSCRIPTS[c] ?? c).join('');
}

/** Hyphen-minus before a digit or a point becomes the minus sign. */
export function withMinusSign(text: string): string {
  return text.replace(/-(?=[\d.])/g, MINUS);
}

/**
 * `figures` significant figures; plain between 0.001 and 100,000, else `2.003 × 10⁻⁴`.
 * The same rule everywhere, so a test can compute what a sheet prints.
 */
export function formatNumber(value: number, figures = 4): string {
  if (!Number.isFinite(value)) return value > 0 ? '∞' : value < 0 ? `${MINUS}∞` : '—';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  // toPrecision keeps trailing zeros that carry figures (0.02810); Number() would drop them.
  const plain = value.toPrecision(figures);
  if (magnitude >= 1e-3 && magnitude < 1e5 && !plain.includes('e')) return withMinusSign(plain);
  const [mantissa, exponent] = value.toExponential(figures - 1).split('e');
  return `${withMinusSign(mantissa)} × 10${superscript(String(Number(exponent)))}`;
}

/** A value as the student wrote it: a string keeps its digits, a number prints as JSON would. */
export function formatReported(value: NumberLike | undefined | null): string {
  if (value === undefined || value === null) return '—';
  // JavaScript writes a number up to 10^21 in full; past a double's 15 or so digits, as a power of ten.
  const text = typeof value === 'string' ? value.trim() : Math.abs(value) >= 1e15 ? value.toExponential() : String(value);
  return withMinusSign(text.replace(/e([-+]?\d+)$/i, (_, e: string) => ` × 10${superscript(String(Number(e)))}`));
}

/** Decimals a power-of-ten form may carry before the value ± SE is written figure by figure instead. */
const MOST_DECIMALS = 8;

/**
 * value ± uncertainty as a result is written by hand: the uncertainty to 2 significant figures and the
 * value to the same decimal place, `−141.0 ± 2.6`, or with one power of ten for both,
 * `(8.857 ± 0.026) × 10⁻⁶`. Without an uncertainty (or with one of 0), `figures` significant figures.
 */
export function formatEstimate(value: number, uncertainty: number | undefined, figures = 4): string {
  if (uncertainty === undefined) return formatNumber(value, figures);
  const se = Math.abs(uncertainty);
  if (!Number.isFinite(value) || !Number.isFinite(se) || se === 0) return `${formatNumber(value, figures)} ± ${formatNumber(se, 2)}`;
  const rounded = Number(se.toPrecision(2));
  // The decimal place of the uncertainty's second figure: 10^place.
  const place = Math.floor(Math.log10(rounded)) - 1;
  const power = Math.floor(Math.log10(Math.max(Math.abs(value), rounded)));
  if (power >= -3 && power < 5 && place >= -MOST_DECIMALS) {
    // Past the decimal point toFixed rounds to the place; before it (an SE of 2600), the value is rounded to it.
    const toPlace = (x: number) => (place > 0 ? (Math.round(x / 10 ** place) * 10 ** place).toFixed(0) : x.toFixed(-place));
    return withMinusSign(`${toPlace(value)} ± ${toPlace(rounded)}`);
  }
  const decimals = Math.max(0, power - place);
  if (decimals > MOST_DECIMALS) return `${formatNumber(value, figures)} ± ${formatNumber(se, 2)}`;
  const scale = 10 ** power;
  return `(${withMinusSign((value / scale).toFixed(decimals))} ± ${(rounded / scale).toFixed(decimals)}) × 10${superscript(String(power))}`;
}

/** Points as the checker counts them: at most 2 decimals, no trailing zeros. */
export function formatPoints(points: number): string {
  return withMinusSign(String(Number(points.toFixed(2))));
}

/** `^-1` or `^(-1)`; a bracket closes only one it opened, so `(… s^-1)` keeps its own. */
const POWER = /\^(?:\(([-+]?\d+)\)|([-+]?\d+))/g;

/** `min^-1` → `min⁻¹`, `dm^3` → `dm³`; other text unchanged. */
export function prettyUnit(unit: string): string {
  return unit.replace(POWER, (_, inBrackets: string | undefined, bare: string | undefined) => superscript(inBrackets ?? bare ?? '')).replace(/\s+/g, ' ').trim();
}

/**
 * The symbols the checkers write in their messages, in the plain form the JSON keeps (`k_obs`, `x_inf`),
 * and the subscript each prints with. A list, not a pattern: a column name such as `temperature_c` in a
 * message is a name to type, not a symbol.
 */
const SYMBOL = /\b([kxE])_(obs|inf|0|t|N|A|B|a)\b/g;
const subscriptOf = (sub: string) => (sub === 'inf' ? '∞' : sub);

/** Numbers and unit exponents as printed, in any text: `min^-1` → `min⁻¹`, `1.0e-5` → `1.0 × 10⁻⁵`, the minus sign. */
function printableNumbers(text: string): string {
  return text
    .replace(/(\d)e([-+]?\d+)\b/g, (_, d: string, e: string) => `${d} × 10${superscript(String(Number(e)))}`)
    .replace(POWER, (_, inBrackets: string | undefined, bare: string | undefined) => superscript(inBrackets ?? bare ?? ''))
    .replace(/(^|[\s(=])-(?=[\d.])/g, `$1${MINUS}`);
}

/**
 * A checker message as the documents print it: unit exponents as superscripts (`min^-1` → `min⁻¹`),
 * numbers in e-notation as powers of ten, the minus sign before a negative number, and each symbol with
 * its subscript in rich-text markup (`k_obs` → `k_{obs}`, `x_inf` → `x_{∞}`, `ΔH‡` → `ΔH^{‡}`), as the
 * headings print them, and quotes as the sheets' own (“0.05 M”). Words stay as written.
 */
export function printableMessage(text: string): string {
  return printableNumbers(text)
    .replace(SYMBOL, (_, base: string, sub: string) => `${base}_{${subscriptOf(sub)}}`)
    .replace(/Δ([HS])‡/g, 'Δ$1^{‡}')
    .replace(/"([^"\n]*)"/g, '“$1”');
}

/**
 * A checker message for a terminal, which has no subscripts: as printed, but each symbol keeps its
 * underscore (`k_obs`, `x_∞`).
 */
export function terminalMessage(text: string): string {
  return printableNumbers(text).replace(SYMBOL, (_, base: string, sub: string) => `${base}_${subscriptOf(sub)}`);
}

/** `±1 %`, `±0.002`, or both (the larger applies, as the checker reads a tolerance). */
export function formatTolerance(tolerance: Tolerance | undefined): string {
  if (!tolerance) return '—';
  const parts: string[] = [];
  if (tolerance.relative !== undefined) parts.push(`±${formatNumber(tolerance.relative * 100, 3).replace(/\.?0+$/, '')} %`);
  if (tolerance.absolute !== undefined) parts.push(`±${withMinusSign(String(tolerance.absolute))}`);
  return parts.length === 2 ? `${parts[0]} or ${parts[1]}, the larger` : parts[0];
}

/** Relative difference of `value` from `reference` in per cent, signed; undefined when the reference is 0. */
export function relativeDifference(value: number, reference: number): number | undefined {
  return reference === 0 ? undefined : ((value - reference) / Math.abs(reference)) * 100;
}

export function formatPercent(percent: number | undefined): string {
  if (percent === undefined || !Number.isFinite(percent)) return '—';
  if (Math.abs(percent) < 0.005) return '0.00 %';
  if (Math.abs(percent) >= 1e5) return `${percent > 0 ? '+' : ''}${formatNumber(percent, 2)} %`;
  const text = Math.abs(percent) >= 100 ? percent.toFixed(0) : Math.abs(percent) >= 10 ? percent.toFixed(1) : percent.toFixed(2);
  return `${percent > 0 ? '+' : ''}${withMinusSign(text)} %`;
}

/** `2024-03-05 14:07 UTC`: dates on the sheets are in UTC, so every reader sees the same time. */
export function formatDate(date: Date | string): string {
  const d = typeof date === 'string' ? new Date(date) : date;
  if (Number.isNaN(d.getTime())) return String(date);
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}
