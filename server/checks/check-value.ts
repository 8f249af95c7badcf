import type { Tolerance } from '../../schemas/common.ts';
import type { Finding } from '../../schemas/result.ts';
import { likelyCause, type CauseVocabulary } from './cause-text.ts';
import type { DraftFinding } from './draft-finding.ts';
import { explain, type Candidate, type Expanded, type Factor, type LaterBases } from './explain.ts';
import { withUnit } from './format.ts';
import { coarselyRounded, roundedFrom, type Rounding } from './rounding-rule.ts';
import { withinTolerance } from './tolerance.ts';

/** One reported number against the refit: right, carried forward, explained by a likely cause, or not. */
export interface ValueCheck {
  /** The quantity in words, e.g. `k_obs of run "0.10 M"`. */
  what: string;
  path: string;
  stage: Finding['stage'];
  rubricItem: string;
  itemKey: string;
  /** Points at stake. */
  charge: number;
  reported: number;
  unit: string;
  expected: number;
  /** Other values that earn full credit (another accepted method). */
  alsoRight?: number[];
  /** A range every value in which is right too: what the data allow when they fix the value only loosely. */
  rightWithin?: [number, number];
  /**
   * The value that follows from the student's own earlier numbers, and where those came from;
   * `quiet` when the value it goes with has already said so (an uncertainty beside its value).
   */
  carriedForward?: { value: number; from: string; quiet?: boolean };
  /** Values produced by known slips of method (each with its cause); asked for only when the value is not right. */
  slips?: () => Candidate[];
  /** Costly ones, tried after all others and only where they could still explain the value best. */
  laterSlips?: LaterBases;
  /** Scalings that known slips of units or copying produce. */
  factors: Factor[];
  /** The kind's words and preferences for causes. */
  causes: CauseVocabulary;
  tolerance: Tolerance;
  /**
   * How close a slip's value must come for the slip to be named, where narrower than `tolerance`;
   * worked out (from the digits written) only for a value that is not right.
   */
  causeTolerance?: () => Tolerance;
  /** The same for a long-shot candidate. */
  closeTolerance?: () => Tolerance;
  /** How the value was written, for the rounding rule (see rounding-rule.ts). */
  rounding?: Rounding;
}

export type ValueOutcome =
  | { kind: 'right' }
  | { kind: 'carried-forward' }
  | { kind: 'explained'; by: Expanded }
  | { kind: 'unexplained' };

// A million times off (or a millionth) is past every scaling a slip of units or method makes (the
// largest, per second for per hour, is 3600): no longer a slip of the analysis.
const ABSURD_ORDERS = 6;

/** How many powers of ten `reported` is from `expected`, signed, when that is absurdly many. */
function absurdOrders(reported: number, expected: number): number | undefined {
  if (reported === 0 || expected === 0) return undefined;
  // As a difference of logarithms: 1e308 over 0.05 overflows as a quotient.
  const orders = Math.round(Math.log10(Math.abs(reported)) - Math.log10(Math.abs(expected)));
  return Math.abs(orders) >= ABSURD_ORDERS ? orders : undefined;
}

const RIGHT: ValueOutcome = Object.freeze({ kind: 'right' });

export function checkValue(c: ValueCheck, drafts: DraftFinding[]): ValueOutcome {
  const { reported, expected, tolerance } = c;
  const inRange = c.rightWithin !== undefined && reported >= c.rightWithin[0] && reported <= c.rightWithin[1];
  // Most values are right: that is settled before anything is made for the search (in a profile of
  // `check --jsonl`, checkValue's own time was 3-5 %, every call allocating the list of right values).
  if (inRange || withinTolerance(reported, expected, tolerance) || c.alsoRight?.some((v) => withinTolerance(reported, v, tolerance))) return RIGHT;
  const rights = [expected, ...(c.alsoRight ?? [])];
  // Plain rounding comes before every slip: a slip is named only where rounding does not give the value.
  const { rounding } = c;
  const rounded = rounding && roundedFrom(reported, rounding);
  const coarse = (reference: number, basis: string) => {
    if (rounding && rounded?.coarse(reference)) drafts.push(coarselyRounded({ ...c, rounding }, reference, basis));
  };
  const roundedRight = rounded && rights.find(rounded.agrees);
  if (roundedRight !== undefined) {
    coarse(roundedRight, roundedRight === expected ? 'the refit from your data' : 'an accepted value');
    return RIGHT;
  }
  const base = {
    path: c.path,
    stage: c.stage,
    reported,
    expected,
    unit: c.unit,
    rubricItem: c.rubricItem,
    itemKey: c.itemKey,
  };
  const intro = `${c.what} is ${withUnit(reported, c.unit)}; the refit from your data gives ${withUnit(expected, c.unit)}.`;
  const carried = c.carriedForward;
  if (carried && (withinTolerance(reported, carried.value, tolerance) || rounded?.agrees(carried.value))) {
    if (!withinTolerance(reported, carried.value, tolerance)) coarse(carried.value, `the value from ${carried.from}`);
    if (carried.quiet) return { kind: 'carried-forward' };
    drafts.push({
      ...base,
      code: 'carried-forward',
      severity: 'info',
      charge: 0,
      message: `${intro} Your value follows correctly from ${carried.from}, so the method earns its points here; the difference was scored where it entered.`,
    });
    return { kind: 'carried-forward' };
  }
  const roots: Candidate[] = [{ value: expected, causes: [], basis: 'the refit' }, ...(c.slips?.() ?? [])];
  if (carried) roots.push({ value: carried.value, causes: [], basis: `the value from ${carried.from}` });
  const by = explain(reported, roots, c.factors, c.causes, c.causeTolerance?.() ?? tolerance, c.closeTolerance?.(), c.laterSlips, rounded?.reproduces);
  if (by && by.causes.length > 0) {
    const [code, ...also] = by.causes;
    const how = by.says.length ? ` ${by.says.join(' and ')}` : '';
    drafts.push({
      ...base,
      code,
      alsoCodes: also.length ? also : undefined,
      detail: by.detail,
      severity: 'error',
      charge: c.charge,
      message: `${intro} Your value matches ${by.basis} (${withUnit(by.root, c.unit)})${how}. ${likelyCause(c.causes, by.causes, by.detail ? [by.detail] : [])}`,
    });
    return { kind: 'explained', by };
  }
  const orders = absurdOrders(reported, expected);
  if (orders !== undefined) {
    drafts.push({
      ...base,
      code: 'implausible',
      severity: 'error',
      charge: c.charge,
      message: `${intro} That is about 10^${orders} times the refit, a magnitude no analysis of these data could give; the likely cause is a typing slip (a wrong exponent or extra digits). Please check the value as entered.`,
    });
    return { kind: 'unexplained' };
  }
  drafts.push({
    ...base,
    code: 'unexplained',
    severity: 'error',
    charge: c.charge,
    message: `${intro} The difference is outside the tolerance, and no common slip explains it, so no cause is suggested. Please check the calculation of this value step by step.`,
  });
  return { kind: 'unexplained' };
}
