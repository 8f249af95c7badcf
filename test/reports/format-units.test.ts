import { describe, expect, it } from 'vitest';
import { formatNumber, formatPercent, formatReported, formatTolerance, prettyUnit, printableMessage, terminalMessage } from '../../reports/format.ts';
import { convertUnit } from '../../reports/units.ts';
import { niceAxis, tickLabel } from '../../reports/pdf/scale.ts';
import { parseRich, plainRich } from '../../reports/pdf/rich-text.ts';

describe('number and unit text', () => {
  it.each([
    [0.028142649, '0.02814'],
    [-0.0117, '\u22120.01170'],
    [0.0002003, '2.003 × 10⁻⁴'],
    [123456, '1.235 × 10⁵'],
    [12345, '1.235 × 10⁴'],
    [0, '0'],
  ])('formatNumber(%d) = %s', (value, text) => expect(formatNumber(value)).toBe(text));

  it('keeps reported strings as written, with the minus sign', () => {
    expect(formatReported('0.0520')).toBe('0.0520');
    expect(formatReported('-2.003e-4')).toBe('\u22122.003 × 10⁻⁴');
    expect(formatReported(undefined)).toBe('—');
  });

  it('prints units, tolerances and differences', () => {
    expect(prettyUnit('M^-1 min^-1')).toBe('M⁻¹ min⁻¹');
    expect(prettyUnit('dm^3 mol^-1 s^-1')).toBe('dm³ mol⁻¹ s⁻¹');
    expect(formatTolerance({ relative: 0.01 })).toBe('±1 %');
    expect(formatTolerance({ absolute: 0.002 })).toBe('±0.002');
    expect(formatTolerance({ relative: 0.02, absolute: 0.0005 })).toBe('±2 % or ±0.0005, the larger');
    expect(formatPercent(-56.61)).toBe('\u221256.6 %');
    expect(formatPercent(-0.001)).toBe('0.00 %');
  });
});

describe('convertUnit', () => {
  it.each([
    [1, 's^-1', 'min^-1', 60],
    [60, 'min^-1', '1/s', 1],
    [1, '/h', 'min⁻¹', 1 / 60],
    [1, 'L mol^-1 s^-1', 'M^-1 min^-1', 60],
    [1, 'dm^3 mol^-1 min^-1', 'M^-1 min^-1', 1],
    [1000, 'mM', 'mol/L', 1],
    [2, 'mol dm^-3', 'M', 2],
  ])('%d %s = %d %s', (value, from, to, expected) => expect(convertUnit(value, from, to)).toBeCloseTo(expected, 12));

  it('refuses units it cannot read or of another kind', () => {
    expect(convertUnit(1, 'per minnit', 'min^-1')).toBeUndefined();
    expect(convertUnit(1, 'M', 'min^-1')).toBeUndefined();
  });
});

describe('plot scales and labels', () => {
  it('rounds axes out to nice steps and prints ticks with the minus sign', () => {
    const axis = niceAxis([-0.52, 0], { pad: 0 });
    expect(axis.min).toBeCloseTo(-0.6);
    expect(axis.max).toBeCloseTo(0, 12);
    expect(tickLabel(axis, -0.4)).toBe('\u22120.4');
    expect(niceAxis([0, 15], { includeZero: true, pad: 0 }).ticks).toEqual([0, 5, 10, 15]);
    expect(niceAxis([0, 0.0004]).power).toBe(-4);
  });

  it('reads sub- and superscript markup', () => {
    expect(parseRich('k_{obs} / min⁻¹')).toEqual([
      { text: 'k', shift: 'base' },
      { text: 'obs', shift: 'sub' },
      { text: ' / min⁻¹', shift: 'base' },
    ]);
    expect(plainRich('α_{∞} x^{2}')).toBe('α∞ x2');
  });
});

describe('printableMessage', () => {
  it('prints unit exponents as superscripts, e-notation as powers of ten and the minus sign', () => {
    expect(printableMessage('k_obs is -0.154 min^-1; the refit gives 1.044e-5 M^-1 min^-1 (x = -2)')).toBe(
      'k_{obs} is \u22120.154 min⁻¹; the refit gives 1.044 × 10⁻⁵ M⁻¹ min⁻¹ (x = \u22122)',
    );
  });
  it('gives the symbols their subscripts (markup) and the quotes their curls; a column name keeps its underscore', () => {
    // Hand-written: the printed forms of the symbols the checkers write.
    expect(printableMessage('x_inf of run "0.05 M" differs from x_0; E_a, k_N, k_A, ln(k_B/h), ΔH‡ and ΔS‡; column temperature_c')).toBe(
      'x_{∞} of run “0.05 M” differs from x_{0}; E_{a}, k_{N}, k_{A}, ln(k_{B}/h), ΔH^{‡} and ΔS^{‡}; column temperature_c',
    );
  });
  it('writes the symbols for a terminal with their underscores, infinity as ∞', () => {
    expect(terminalMessage('x_inf is 9.4; k_obs is 2e-3 min^-1')).toBe('x_∞ is 9.4; k_obs is 2 × 10⁻³ min⁻¹');
  });
  it('leaves hyphenated words alone', () => {
    expect(printableMessage('a log-base slip in run A-2')).toBe('a log-base slip in run A-2');
  });
  it('keeps the bracket that closes a unit in brackets, and reads a bracketed exponent', () => {
    // The bracket after s^-1 belongs to the sentence, not to the exponent (hand-written expectation).
    expect(printableMessage('matches the refit (5.314e-4 s^-1) divided by 60')).toBe('matches the refit (5.314 × 10⁻⁴ s⁻¹) divided by 60');
    expect(printableMessage('the refit (0.02 min^-1)')).toBe('the refit (0.02 min⁻¹)');
    expect(prettyUnit('M^(-1) min^-1')).toBe('M⁻¹ min⁻¹');
  });
});
