import type { Tolerance } from '../../schemas/common.ts';
import type { CauseVocabulary } from './cause-text.ts';
import { withinTolerance } from './tolerance.ts';

/**
 * Explaining a mismatch: each candidate is a value the student would have reported had they made
 * the slips named in `causes`. A reported value is explained by the candidates it matches within
 * tolerance; the fewest causes win (the simplest story), then the kind's order of preference.
 */
export interface Candidate {
  value: number;
  causes: string[];
  /** What the cause was in this case, e.g. "x_inf = last reading (10.873)". */
  detail?: string;
  /** What the value is, in words: "the refit", "the slope of t against ln F". */
  basis: string;
  /** Against another explanation with as many causes, the closer one wins, not the more common. */
  closestWins?: boolean;
  /** One of many similar guesses (every copying variant of a number): named only on a close match. */
  longShot?: boolean;
}

/** Common slips that scale a value; which apply depends on the quantity. */
export interface Factor {
  factor: number;
  cause: string;
  /** How the factor reads in a message, e.g. "divided by ln 10 = 2.302585". */
  says: string;
}

// ln 10 = 2.302585093 (a mathematical constant): log10 x = ln x / ln 10.
export const LN10 = Math.LN10;

export const SIGN: Factor = { factor: -1, cause: 'sign-flipped', says: 'with the sign reversed' };
export const LOG_BASE: Factor = { factor: 1 / LN10, cause: 'log-base', says: 'divided by ln 10 = 2.302585' };
// 60 s per min and 60 min per h: definitions of the minute and hour.
export const TIME_UNIT: Factor[] = [
  { factor: 1 / 60, cause: 'time-unit', says: 'divided by 60 (per second reported as per minute, or per minute as per hour)' },
  { factor: 60, cause: 'time-unit', says: 'multiplied by 60 (per minute reported as per second, or per hour as per minute)' },
  { factor: 1 / 3600, cause: 'time-unit', says: 'divided by 3600 (per second reported as per hour)' },
  { factor: 3600, cause: 'time-unit', says: 'multiplied by 3600 (per hour reported as per second)' },
];
// 1000 mM per M: the definition of the milli prefix.
export const CONCENTRATION_UNIT: Factor[] = [
  { factor: 1 / 1000, cause: 'concentration-unit', says: 'divided by 1000 (concentrations in mM where M was meant)' },
  { factor: 1000, cause: 'concentration-unit', says: 'multiplied by 1000 (concentrations in M where mM was meant)' },
];
export const DECIMAL_SHIFT: Factor[] = [-3, -2, -1, 1, 2, 3].map((p) => ({
  factor: 10 ** p,
  cause: 'decimal-shift' as const,
  says: `${p > 0 ? 'multiplied' : 'divided'} by ${10 ** Math.abs(p)} (a misplaced decimal point)`,
}));

/** The scalings a slip can give a rate constant: its sign, the logarithm's base, the time unit, the decimal point. */
export const RATE_CONSTANT_FACTORS: Factor[] = [SIGN, LOG_BASE, ...TIME_UNIT, ...DECIMAL_SHIFT];

/** A candidate made from a base value: `root` is the base, `says` how the slips scaled it. */
export type Expanded = Candidate & { root: number; says: string[] };

const rankOf = (causes: readonly string[], priority: readonly string[]) => Math.min(...causes.map((code) => priority.indexOf(code) + 1), priority.length + 1);

function better(c: Candidate, best: Candidate, reported: number, priority: readonly string[]): boolean {
  if (c.causes.length !== best.causes.length) return c.causes.length < best.causes.length;
  const rank = (x: Candidate) => rankOf(x.causes, priority);
  const dc = Math.abs(reported - c.value);
  const db = Math.abs(reported - best.value);
  // Two ways to the same number (to rounding) are told apart by which slip is commoner.
  const sameNumber = Math.abs(dc - db) <= 1e-9 * Math.abs(reported);
  if ((c.closestWins || best.closestWins || rank(c) === rank(best)) && !sameNumber) return dc < db;
  return rank(c) < rank(best);
}

/**
 * Bases that are costly to make (dozens of refits), each with exactly the one cause `cause` and no
 * `closestWins`: made only when one of them could still be the best explanation.
 */
export interface LaterBases {
  cause: string;
  bases: () => Candidate[];
}

/**
 * Whether a base with the one cause `cause` could beat `best`: by fewer causes, or by as many and a
 * commoner cause or (at the same rank or where `best` asks for it) a closer value. A best of no cause,
 * or of one commoner cause without `closestWins`, cannot be beaten by it.
 */
function beatable(best: Expanded | undefined, cause: string, priority: readonly string[]): boolean {
  if (!best) return true;
  if (best.causes.length === 0) return false;
  if (best.causes.length > 1 || best.closestWins) return true;
  return rankOf(best.causes, priority) >= rankOf([cause], priority);
}

/**
 * The best explanation of `reported`, or undefined when none matches. The candidates are every base
 * value alone, with one scaling, and with one scaling and the sign: at most two causes. Two scalings
 * at once are named only when one is the sign, which moves no magnitude, and a slip of method joins
 * only the scalings the kind's vocabulary allows. A candidate is built only when its value matches,
 * within the tolerance or, where `reproduces` says so, rounded to the digits written; almost none do.
 */
export function explain(
  reported: number,
  bases: Candidate[],
  factors: Factor[],
  vocabulary: Pick<CauseVocabulary, 'priority' | 'joinMethodSlips'>,
  tolerance: Tolerance,
  closeTolerance = tolerance,
  later?: LaterBases,
  reproduces: (value: number) => boolean = () => false,
): Expanded | undefined {
  let best: Expanded | undefined;
  const offer = (b: Candidate, value: number, causes: string[], says: string[]) => {
    // Fields named one by one: a candidate may be a class whose words are a getter.
    const c: Expanded = { value, causes, detail: b.detail, basis: b.basis, closestWins: b.closestWins, longShot: b.longShot, root: b.value, says };
    if (!best || better(c, best, reported, vocabulary.priority)) best = c;
  };
  const sign = factors.find((f) => f.cause === 'sign-flipped');
  const consider = (b: Candidate) => {
    // A long-shot base and every scaling of it must match within the closer band.
    const band = b.longShot ? closeTolerance : tolerance;
    const matches = (value: number) => Number.isFinite(value) && (withinTolerance(reported, value, band) || reproduces(value));
    if (matches(b.value)) offer(b, b.value, b.causes, []);
    for (const f of factors) {
      if (b.causes.length > 0 && !vocabulary.joinMethodSlips.has(f.cause)) continue;
      const scaled = b.value * f.factor;
      if (matches(scaled)) offer(b, scaled, [...b.causes, f.cause], [f.says]);
      if (sign && f !== sign && b.causes.length === 0 && matches(-scaled)) offer(b, -scaled, [sign.cause, f.cause], [sign.says, f.says]);
    }
  };
  bases.forEach(consider);
  if (later && beatable(best, later.cause, vocabulary.priority)) later.bases().forEach(consider);
  return best;
}
