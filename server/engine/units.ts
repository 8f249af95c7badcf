import { EngineError } from './engine-error.ts';

/**
 * Units of time, concentration, zero-, first- and second-order rate constants, molar energy, molar
 * entropy, length and molar absorptivity. Text is parsed by a small grammar (atoms with integer
 * exponents, products, `/`, one level of parentheses) into a dimension over (time, amount, length,
 * energy, temperature) and a scale, so that every reasonable spelling of one unit agrees. Base units,
 * factor 1: s, M (mol dm^-3), s^-1, M^-1 s^-1, J mol^-1, J K^-1 mol^-1, M s^-1, dm and dm^2 mol^-1
 * (M^-1 cm^-1 is 10 of these). Temperatures themselves have an offset (degrees Celsius), which a
 * factor cannot say: `temperature.ts` reads them.
 */
export type UnitKind = 'time' | 'concentration' | 'first-order-rate' | 'second-order-rate' | 'molar-energy' | 'molar-entropy' | 'zero-order-rate' | 'length' | 'molar-absorptivity';

export interface Unit {
  /** As given, trimmed. */
  text: string;
  kind: UnitKind;
  /** value x factor = value in the base unit of the kind. */
  factor: number;
}

type Dim = [time: number, amount: number, length: number, energy: number, temperature: number];

/**
 * Powers of ten are kept apart from the other multipliers and applied once at the end: 10^n is exact
 * for the small n used here and one division rounds once, whereas 0.1 ** 3 is not 0.001.
 */
interface Scale {
  dim: Dim;
  mult: number;
  pow10: number;
}

const KIND_DIMS: Record<UnitKind, Dim> = {
  time: [1, 0, 0, 0, 0],
  concentration: [0, 1, -3, 0, 0],
  'first-order-rate': [-1, 0, 0, 0, 0],
  'second-order-rate': [-1, -1, 3, 0, 0],
  'molar-energy': [0, -1, 0, 1, 0],
  'molar-entropy': [0, -1, 0, 1, -1],
  // Added last so that the list of kinds in an error message keeps its beginning.
  'zero-order-rate': [-1, 1, -3, 0, 0],
  length: [0, 0, 1, 0, 0],
  'molar-absorptivity': [0, -1, 2, 0, 0],
};

// Lengths in dm, so that L = dm^3 and M = mol dm^-3 both have factor 1.
const ATOMS = new Map<string, Scale>();
function define(names: string, dim: Dim, mult: number, pow10 = 0): void {
  for (const name of names.split(' ')) ATOMS.set(name, { dim, mult, pow10 });
}
define('1', [0, 0, 0, 0, 0], 1);
// The spellings students use, each unambiguous here (S and H, which name other units, are not read).
define('s sec secs second seconds', [1, 0, 0, 0, 0], 1);
define('ms', [1, 0, 0, 0, 0], 1, -3);
define('min mins Min Mins minute minutes', [1, 0, 0, 0, 0], 60);
define('h hr hrs hour hours', [1, 0, 0, 0, 0], 3600);
define('d day days', [1, 0, 0, 0, 0], 86400);
define('mol', [0, 1, 0, 0, 0], 1);
define('mmol', [0, 1, 0, 0, 0], 1, -3);
define('umol', [0, 1, 0, 0, 0], 1, -6);
define('L l', [0, 0, 3, 0, 0], 1);
define('mL ml', [0, 0, 3, 0, 0], 1, -3);
define('m', [0, 0, 1, 0, 0], 1, 1);
define('dm', [0, 0, 1, 0, 0], 1);
define('cm', [0, 0, 1, 0, 0], 1, -1);
define('mm', [0, 0, 1, 0, 0], 1, -2);
define('M', [0, 1, -3, 0, 0], 1);
define('mM', [0, 1, -3, 0, 0], 1, -3);
define('uM', [0, 1, -3, 0, 0], 1, -6);
define('nM', [0, 1, -3, 0, 0], 1, -9);
// The thermochemical calorie, 4.184 J exactly by definition; K is the kelvin (an interval of temperature).
define('J', [0, 0, 0, 1, 0], 1);
define('kJ', [0, 0, 0, 1, 0], 1, 3);
define('cal', [0, 0, 0, 1, 0], 4.184);
define('kcal', [0, 0, 0, 1, 0], 4.184, 3);
define('K', [0, 0, 0, 0, 1], 1);

const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';
// Groups: whitespace | / ( ) | explicit product sign | atom | exponent sign, digits. The lone 1 may
// not touch letters or digits, so "10/min" and "1min" are rejected. − is the typographic minus.
const TOKEN = /(\s+)|([/()])|([*·⋅.])|(1(?![\wµμ])|[A-Za-zµμ]+)|\^?([-−⁻]?)([0-9]+|[⁰¹²³⁴⁵⁶⁷⁸⁹]+)/gy;

function scaleOf(text: string, fail: (detail?: string) => never): Scale {
  const frames = [{ acc: { dim: [0, 0, 0, 0, 0] as Dim, mult: 1, pow10: 0 }, sign: 1 }];
  let pending: Scale | undefined; // the last atom or group, still open to an exponent
  let expectFactor = true; // at the start and after / ( or a product sign
  let end = 0;
  const commit = (exponent = 1) => {
    if (!pending) return;
    const { acc, sign } = frames[frames.length - 1];
    const e = sign * exponent;
    for (let k = 0; k < acc.dim.length; k++) acc.dim[k] += pending.dim[k] * e;
    acc.mult = e < 0 ? acc.mult / pending.mult ** -e : acc.mult * pending.mult ** e;
    acc.pow10 += pending.pow10 * e;
    pending = undefined;
  };
  for (const m of text.matchAll(TOKEN)) {
    const [token, space, punct, product, atom, minus, digits] = m;
    end = m.index + token.length;
    if (space) {
      commit(); // an exponent must touch its atom: "dm 3" is not dm^3
    } else if (atom) {
      commit();
      pending = ATOMS.get(atom.replace(/[µμ]/g, 'u'));
      if (!pending) fail(`no unit "${atom}"`);
      expectFactor = false;
    } else if (digits) {
      if (!pending) fail();
      const value = Number(digits.replace(/[⁰¹²³⁴⁵⁶⁷⁸⁹]/g, (c) => String(SUPERSCRIPT_DIGITS.indexOf(c))));
      commit(minus ? -value : value);
    } else if (product) {
      if (expectFactor) fail();
      commit();
      expectFactor = true;
    } else if (punct === '/') {
      // A leading slash is read as "per": "/min" is min^-1, as students write "0.05 /min".
      if (expectFactor && m.index !== 0) fail();
      commit();
      frames[frames.length - 1].sign = -1;
      expectFactor = true;
    } else if (punct === '(') {
      commit();
      if (frames.length > 1) fail('nested parentheses');
      frames.push({ acc: { dim: [0, 0, 0, 0, 0], mult: 1, pow10: 0 }, sign: 1 });
      expectFactor = true;
    } else {
      commit();
      if (frames.length === 1) fail('unbalanced parentheses');
      if (expectFactor) fail();
      pending = frames.pop()!.acc;
    }
  }
  commit();
  if (end !== text.length || expectFactor) fail();
  if (frames.length > 1) fail('unbalanced parentheses');
  return frames[0].acc;
}

// Parsed spellings, kept because every fitted estimate names its unit; bounded against odd input.
const parsed = new Map<string, Unit>();
const MAX_PARSED = 1000;

/** Exponents as spreadsheets and typesetting write them: min^{-1}, min^(-1) and min**-1 are min^-1. */
function plainExponents(text: string): string {
  return text.replace(/\*\*/g, '^').replace(/\^\{([-−]?\d+)\}/g, '^$1').replace(/\^\(([-−]?\d+)\)/g, '^$1');
}

function parseNew(text: string, trimmed: string, field: string): Unit {
  function fail(detail?: string): never {
    throw new EngineError('unknown-unit', `unknown unit "${text}"${detail ? `: ${detail}` : ''}`, field);
  }
  const { dim, mult, pow10 } = scaleOf(plainExponents(trimmed), fail);
  const kinds = Object.keys(KIND_DIMS) as UnitKind[];
  const kind = kinds.find((k) => KIND_DIMS[k].every((d, i) => d === dim[i]));
  if (!kind) fail(`not a unit of ${kinds.join(', ')}`);
  return Object.freeze({ text: trimmed, kind, factor: pow10 < 0 ? mult / 10 ** -pow10 : mult * 10 ** pow10 });
}

export function parseUnit(text: string, expected?: UnitKind, field = 'unit'): Unit {
  const trimmed = text.trim();
  let unit = parsed.get(trimmed);
  if (!unit) {
    unit = parseNew(text, trimmed, field);
    if (parsed.size >= MAX_PARSED) parsed.clear();
    parsed.set(trimmed, unit);
  }
  if (expected && unit.kind !== expected) throw kindMismatch(trimmed, unit.kind, expected, field);
  return unit;
}

function kindMismatch(text: string, kind: UnitKind, expected: UnitKind, field: string): EngineError {
  return new EngineError('unit-kind-mismatch', `"${text}" is a ${kind} unit, not a ${expected} unit`, field);
}

function asUnit(unit: Unit | string, expected?: UnitKind): Unit {
  if (typeof unit === 'string') return parseUnit(unit, expected);
  if (expected && unit.kind !== expected) throw kindMismatch(unit.text, unit.kind, expected, 'unit');
  return unit;
}

export function convert(value: number, from: Unit | string, to: Unit | string): number {
  const a = asUnit(from);
  const b = asUnit(to);
  if (a.kind !== b.kind) {
    throw new EngineError('unit-kind-mismatch', `cannot convert ${a.kind} "${a.text}" to ${b.kind} "${b.text}"`, 'unit');
  }
  return (value * a.factor) / b.factor;
}

const TIME_SYMBOLS = [['s', 1], ['min', 60], ['h', 3600]] as const;

export function timeSymbol(unit: Unit): 's' | 'min' | 'h' | undefined {
  if (unit.kind !== 'time') return undefined;
  return TIME_SYMBOLS.find(([, f]) => Math.abs(unit.factor - f) <= 1e-12 * f)?.[0];
}

// Every estimate names its unit: a time unit's rate unit is worked out once (units are frozen and kept).
const rateUnits = new WeakMap<Unit, string>();

export function rateUnitOf(timeUnit: Unit | string): string {
  const unit = asUnit(timeUnit, 'time');
  let rate = rateUnits.get(unit);
  if (rate === undefined) {
    rate = `${timeSymbol(unit) ?? `(${unit.text})`}^-1`;
    rateUnits.set(unit, rate);
  }
  return rate;
}

export function secondOrderRateUnitOf(concentrationUnit: Unit | string, timeUnit: Unit | string): string {
  const { text } = asUnit(concentrationUnit, 'concentration');
  const shown = /^(M|mM|[uµμ]M)$/.test(text) ? text.replace(/^[uμ]/, 'µ') : `(${text})`;
  return `${shown}^-1 ${rateUnitOf(timeUnit)}`;
}
