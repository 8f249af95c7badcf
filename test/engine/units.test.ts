import { describe, expect, it } from 'vitest';
import {
  convert,
  parseUnit,
  rateUnitOf,
  secondOrderRateUnitOf,
  timeSymbol,
} from '../../server/engine/units.ts';
import type { UnitKind } from '../../server/engine/units.ts';
import { thrown } from '../support/thrown.ts';

const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('conversion between units of one kind', () => {
  // 1 min = 60 s and 1 h = 3600 s by definition: SI Brochure, 9th ed. (2019), table 8.
  it('converts minutes and hours to seconds exactly', () => {
    expect(convert(1, 'min', 's')).toBe(60);
    expect(convert(1, 'h', 's')).toBe(3600);
    expect(convert(7200, 's', 'h')).toBe(2);
  });

  // The prefix milli is 10^-3 by definition (SI Brochure, 9th ed., table 7).
  it('converts molar to millimolar exactly', () => {
    expect(convert(1, 'M', 'mM')).toBe(1000);
    expect(convert(250, 'mM', 'M')).toBe(0.25);
  });

  it('converts a first-order rate constant per minute to per second', () => {
    expect(convert(0.05, 'min^-1', 's^-1').toExponential(4)).toBe('8.3333e-4');
  });

  it('converts a second-order rate constant per minute to per second', () => {
    // Worked value in test/reference/kinetics-check-values.md, derived there.
    expect(convert(0.594, 'M^-1 min^-1', 'M^-1 s^-1').toExponential(2)).toBe('9.90e-3');
  });

  it('gives one value to every spelling of M^-1 s^-1', () => {
    expect(convert(1, 'L mol^-1 s^-1', 'M^-1 s^-1')).toBe(1);
    expect(convert(1, 'dm^3 mol^-1 s^-1', 'M^-1 s^-1')).toBe(1);
    expect(convert(1000, 'cm^3 mol^-1 s^-1', 'M^-1 s^-1')).toBe(1);
    expect(convert(1, 'M^-1 s^-1', 'cm3 mol-1 s-1')).toBe(1000);
  });

  it('multiplies by 1000 from mM^-1 s^-1 to M^-1 s^-1', () => {
    expect(convert(2.5, 'mM^-1 s^-1', 'M^-1 s^-1')).toBe(2500);
  });

  // The prefix kilo is 10^3 (SI Brochure, 9th ed., table 7); the thermochemical calorie is 4.184 J
  // exactly by its definition (from memory).
  it('converts molar energies between kJ, J, cal and kcal per mole, in any spelling', () => {
    expect(parseUnit('kJ mol^-1')).toEqual({ text: 'kJ mol^-1', kind: 'molar-energy', factor: 1000 });
    expect(convert(1, 'kJ/mol', 'J mol^-1')).toBe(1000);
    expect(convert(1, 'kcal mol-1', 'kJ/mol')).toBeCloseTo(4.184, 12);
    expect(convert(4184, 'J/mol', 'kcal/mol')).toBeCloseTo(1, 12);
  });

  it('converts molar entropies, and keeps them apart from molar energies', () => {
    expect(parseUnit('J K^-1 mol^-1')).toEqual({ text: 'J K^-1 mol^-1', kind: 'molar-entropy', factor: 1 });
    expect(convert(1, 'cal/(mol K)', 'J K^-1 mol^-1')).toBeCloseTo(4.184, 12);
    expect(thrown(() => convert(1, 'J/mol', 'J K^-1 mol^-1')).code).toBe('unit-kind-mismatch');
    expect(thrown(() => parseUnit('kJ')).code).toBe('unknown-unit');
  });

  it('accepts a Unit as well as text', () => {
    expect(convert(3, parseUnit('h'), parseUnit('min'))).toBe(180);
  });
});

describe('parsing', () => {
  // "/min" is accepted as "per minute": students write "k = 0.05 /min", and it cannot mean anything else.
  it.each(['1/min', '/min', 'min^-1', 'min-1', 'min⁻¹', ' min^-1 ', 'minute^-1', '1/(min)', '(min)^-1'])(
    'reads %j as per minute',
    (text) => {
      expect(parseUnit(text)).toEqual({ text: text.trim(), kind: 'first-order-rate', factor: 1 / 60 });
    },
  );

  it.each([
    ['mol/L', 1],
    ['mol L^-1', 1],
    ['mol dm^-3', 1],
    ['mol·dm⁻³', 1],
    ['mol.dm-3', 1],
    ['M', 1],
    ['mmol/L', 1e-3],
    ['mM', 1e-3],
    ['µM', 1e-6],
    ['μM', 1e-6],
    ['uM', 1e-6],
    ['µmol/mL', 1e-3],
    ['mol/m^3', 1e-3],
  ])('reads %j as a concentration with factor %f', (text, factor) => {
    const unit = parseUnit(text);
    expect(unit.kind).toBe('concentration');
    expect(relErr(unit.factor, factor)).toBeLessThan(1e-15);
  });

  it.each([
    ['s', 'time', 1],
    ['seconds', 'time', 1],
    ['hr', 'time', 3600],
    ['h-1', 'first-order-rate', 1 / 3600],
    ['1/(M s)', 'second-order-rate', 1],
    ['M-1 s-1', 'second-order-rate', 1],
    ['L/(mol·min)', 'second-order-rate', 1 / 60],
    ['L/mol/min', 'second-order-rate', 1 / 60],
    ['dm3 * mol^-1 * s^-1', 'second-order-rate', 1],
    ['mL mmol⁻¹ h⁻¹', 'second-order-rate', 1 / 3600],
    ['(mol/L)^-1 min^-1', 'second-order-rate', 1 / 60],
  ] as Array<[string, UnitKind, number]>)('reads %j as %s with factor %f', (text, kind, factor) => {
    const unit = parseUnit(text);
    expect(unit.kind).toBe(kind);
    expect(relErr(unit.factor, factor)).toBeLessThan(1e-15);
  });

  // Zero-order rate constants, lengths and molar absorptivities in the base units M s^-1, dm and
  // dm^2 mol^-1: by the SI's definitions of the prefixes, the litre (1 L = 1 dm^3) and the minute;
  // 1 M^-1 cm^-1 = 1 dm^3 mol^-1 / (0.1 dm) = 10 dm^2 mol^-1, and 1 m^2 mol^-1 = 100 dm^2 mol^-1.
  it.each([
    ['M min^-1', 'zero-order-rate', 1 / 60],
    ['mol L^-1 s^-1', 'zero-order-rate', 1],
    ['mM/s', 'zero-order-rate', 1e-3],
    ['cm', 'length', 0.1],
    ['mm', 'length', 0.01],
    ['m', 'length', 10],
    ['M^-1 cm^-1', 'molar-absorptivity', 10],
    ['L mol^-1 cm^-1', 'molar-absorptivity', 10],
    ['cm^2 mol^-1', 'molar-absorptivity', 0.01],
    ['m^2 mol^-1', 'molar-absorptivity', 100],
  ] as Array<[string, UnitKind, number]>)('reads %j as %s with factor %f', (text, kind, factor) => {
    const unit = parseUnit(text);
    expect(unit.kind).toBe(kind);
    expect(relErr(unit.factor, factor)).toBeLessThan(1e-15);
  });

  // The spellings students write, each with one meaning here (common practice, no source): a
  // millisecond and a day are 10^-3 s and 86,400 s by the SI's definitions of the prefix and the day.
  it.each([
    ['mins', 'time', 60],
    ['Min', 'time', 60],
    ['secs', 'time', 1],
    ['hrs', 'time', 3600],
    ['ms', 'time', 1e-3],
    ['d', 'time', 86400],
    ['days', 'time', 86400],
    ['nM', 'concentration', 1e-9],
    ['min^{-1}', 'first-order-rate', 1 / 60],
    ['min^(-1)', 'first-order-rate', 1 / 60],
    ['min**-1', 'first-order-rate', 1 / 60],
    ['M^{-1} s^{-1}', 'second-order-rate', 1],
    ['mins^-1', 'first-order-rate', 1 / 60],
  ] as Array<[string, UnitKind, number]>)('reads the student spelling %j as %s with factor %f', (text, kind, factor) => {
    const unit = parseUnit(text);
    expect(unit).toMatchObject({ text, kind });
    expect(relErr(unit.factor, factor)).toBeLessThan(1e-15);
  });

  it('is case-sensitive: m is the metre and mM millimolar, M molar', () => {
    expect(parseUnit('mol/m3').factor).toBe(1e-3);
    expect(parseUnit('mM').factor).toBe(1e-3);
    expect(thrown(() => parseUnit('MIN')).code).toBe('unknown-unit');
  });
});

describe('rejection', () => {
  it('names an unknown unit exactly as given, in the field "unit" by default', () => {
    const error = thrown(() => parseUnit('furlong'));
    expect(error.code).toBe('unknown-unit');
    expect(error.message).toContain('"furlong"');
    expect(error.field).toBe('unit');
  });

  it('passes the field through', () => {
    expect(thrown(() => parseUnit('furlong', 'time', 'timeUnit')).field).toBe('timeUnit');
    expect(thrown(() => parseUnit('min', 'concentration', 'concentrationUnit')).field).toBe('concentrationUnit');
  });

  it.each(['', '   ', '/', 'min/', 'mol//L', '*min', 'min*', 'min^', 'dm 3', '10/min', '1/((M s))', '1/(M s', 'M s)', '()'])(
    'rejects %j as unknown',
    (text) => {
      const error = thrown(() => parseUnit(text));
      expect(error.code).toBe('unknown-unit');
      expect(error.message).toContain(`"${text}"`);
    },
  );

  it.each(['mol', 's^-2', 'L', '1', 'M s'])('rejects %j, a dimension of none of the four kinds, naming the kinds', (text) => {
    const error = thrown(() => parseUnit(text));
    expect(error.code).toBe('unknown-unit');
    expect(error.message).toContain('time, concentration, first-order-rate, second-order-rate');
  });

  it('rejects a unit of another kind than expected, naming both kinds', () => {
    const error = thrown(() => parseUnit('min', 'concentration'));
    expect(error.code).toBe('unit-kind-mismatch');
    expect(error.message).toContain('time');
    expect(error.message).toContain('concentration');
  });

  it('never converts across kinds', () => {
    expect(thrown(() => convert(1, 'min', 'M')).code).toBe('unit-kind-mismatch');
    expect(thrown(() => convert(1, 'min^-1', 'M^-1 min^-1')).code).toBe('unit-kind-mismatch');
  });
});

describe('display symbols', () => {
  it('gives the short symbol of s, min and h and none otherwise', () => {
    expect(timeSymbol(parseUnit('seconds'))).toBe('s');
    expect(timeSymbol(parseUnit('minutes'))).toBe('min');
    expect(timeSymbol(parseUnit('hours'))).toBe('h');
    expect(timeSymbol(parseUnit('min^2 s^-1'))).toBe('h');
    expect(timeSymbol(parseUnit('min^3 s^-2'))).toBeUndefined();
    expect(timeSymbol(parseUnit('min^-1'))).toBeUndefined();
  });

  it('writes first-order rate units from a time unit', () => {
    expect(rateUnitOf('min')).toBe('min^-1');
    expect(rateUnitOf('minutes')).toBe('min^-1');
    expect(rateUnitOf(parseUnit('s'))).toBe('s^-1');
    expect(rateUnitOf('min^3 s^-2')).toBe('(min^3 s^-2)^-1');
    expect(thrown(() => rateUnitOf('M')).code).toBe('unit-kind-mismatch');
    expect(thrown(() => rateUnitOf(parseUnit('M'))).code).toBe('unit-kind-mismatch');
  });

  it('writes second-order rate units from a concentration and a time unit', () => {
    expect(secondOrderRateUnitOf('M', 'min')).toBe('M^-1 min^-1');
    expect(secondOrderRateUnitOf('mM', 's')).toBe('mM^-1 s^-1');
    expect(secondOrderRateUnitOf('uM', 'hours')).toBe('µM^-1 h^-1');
    expect(secondOrderRateUnitOf('μM', 's')).toBe('µM^-1 s^-1');
    expect(secondOrderRateUnitOf('mol/L', 'min')).toBe('(mol/L)^-1 min^-1');
    expect(thrown(() => secondOrderRateUnitOf('min', 'M')).code).toBe('unit-kind-mismatch');
  });

  it('writes rate units that parse back to the rate they name', () => {
    for (const [c, t] of [['M', 'min'], ['µM', 'h'], ['mol/L', 'min'], ['mmol dm^-3', 's']]) {
      const rate = parseUnit(secondOrderRateUnitOf(c, t), 'second-order-rate');
      expect(relErr(rate.factor, 1 / (parseUnit(c).factor * parseUnit(t).factor))).toBeLessThan(1e-15);
    }
    expect(parseUnit(rateUnitOf('min^3 s^-2'), 'first-order-rate').factor).toBe(1 / 216000);
  });
});
