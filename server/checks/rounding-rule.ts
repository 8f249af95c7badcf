import type { NumberLike } from '../../schemas/common.ts';
import type { DraftFinding } from './draft-finding.ts';
import { withUnit } from './format.ts';
import { finestPlace, firstFigurePlace, lastPlace } from './written-number.ts';

/**
 * The rounding rule: a reported value agrees with a reference when it is that reference rounded to
 * the value's own last written place (within half a unit of it), provided that place is at least as
 * fine as the first significant figure of the value's standard error. A value written more coarsely
 * than that, but rounded right, is a fault of presentation (significant figures), not a wrong value:
 * a value near zero (k_N 0.00011 ± 0.00058) is held by no relative tolerance, only by its digits
 * (common practice, no source).
 */
export interface Rounding {
  /** The value as sent: a string keeps its digits, a JSON number is read as it prints. */
  written: NumberLike;
  /**
   * The standard error that goes with the value, in the comparison's unit, and whether it is ours (the
   * student gave none); `itself` for a standard error, which must keep at least the first figure of
   * the value it is compared with (0.00001 is not 0.0000054 rounded).
   */
  uncertainty: { value: number; ours: boolean } | 'itself' | undefined;
  /** What a value rounded more coarsely than its standard error costs: the sigFigs rubric item's worth. */
  sigFigsCharge: number;
}

// Where the student gives no SE, theirs is unseen and may be any that counts as right (the default band
// for a right SE is 25 %; another convention, or rounding, moves it so): 9.96e12 may have been theirs
// at 1.0e13, and A written 4e13 is then to its first figure.
const UNSEEN_SE_BAND = 0.25;

export interface RoundedValue {
  /** Whether `reference`, rounded to the value's last written place, gives the value. */
  agrees: (reference: number) => boolean;
  /**
   * Whether the value, agreeing with `reference`, is written more coarsely than its standard error's
   * first figure. Not where zeros that may follow unseen (lost from a JSON number, or an integer's
   * trailing zeros) could reach that figure's place and the value agrees there too: no finding
   * rests on them.
   */
  coarse: (reference: number) => boolean;
  /**
   * Whether a slip's value, rounded to the value's last written place, gives the value: a slip
   * reproduces it to its digits (-0.00011 for +1.068e-4 with the sign reversed), keeping at least
   * the slip value's first figure. Only where that place is at least as fine as the standard
   * error's first figure: a value written too coarsely says too little to name a slip by.
   */
  reproduces: (candidate: number) => boolean;
}

/** The rule for `reported` (`rounding.written` in the comparison's unit); none without a standard error to measure the place by. */
export function roundedFrom(reported: number, rounding: Rounding): RoundedValue | undefined {
  const { uncertainty } = rounding;
  const place = lastPlace(rounding.written, reported);
  if (uncertainty === undefined || !(place > 0) || !Number.isFinite(place)) return undefined;
  // The factors 1 + 1e-9 absorb binary arithmetic: 0.014 - 0.0135 is not exactly 0.0005.
  const fineEnough = (x: number) => x > 0 && Number.isFinite(x) && place <= firstFigurePlace(x) * (1 + 1e-9);
  const near = (reference: number) => Math.abs(reported - reference) <= 0.5 * place * (1 + 1e-9);
  if (uncertainty === 'itself') {
    const agrees = (reference: number) => fineEnough(Math.abs(reference)) && near(reference);
    return { agrees, coarse: () => false, reproduces: agrees };
  }
  const se = uncertainty.ours ? uncertainty.value * (1 + UNSEEN_SE_BAND) : uncertainty.value;
  if (!(se > 0) || !Number.isFinite(se)) return undefined;
  // A slip's value must keep at least its first figure too: 0.00000 reproduces no slip's 1.8e-6.
  if (fineEnough(se)) return { agrees: near, coarse: () => false, reproduces: (candidate) => fineEnough(Math.abs(candidate)) && near(candidate) };
  const needed = firstFigurePlace(se);
  const zerosReach = finestPlace(rounding.written, reported) <= needed * (1 + 1e-9);
  // Too coarse a rounding is a matter of figures only while it keeps the reference's first figure:
  // 66.5 written "100" (to the hundreds) is not 66.5 rounded, whose one figure gives 70; 96 is 100.
  const keepsFirstFigure = (reference: number) =>
    Math.abs(reported - reference) <= 0.5 * Math.min(place, firstFigurePlace(Math.abs(reference))) * (1 + 1e-9);
  return {
    agrees: (reference) => near(reference) && keepsFirstFigure(reference),
    coarse: (reference) => !(zerosReach && Math.abs(reported - reference) <= 0.5 * needed * (1 + 1e-9)),
    reproduces: () => false,
  };
}

/** The finding for a value rounded right but more coarsely than its standard error allows. */
export function coarselyRounded(
  at: { what: string; path: string; unit: string; reported: number; rounding: Rounding },
  reference: number,
  basis: string,
): DraftFinding {
  const { rounding } = at;
  const se = rounding.uncertainty as { value: number; ours: boolean };
  const seWords = se.ours ? 'the standard error of the refit' : 'its standard error';
  return {
    code: 'sig-figs',
    detail: 'value-under-precise',
    path: at.path,
    stage: 'reporting',
    rubricItem: 'sigFigs',
    itemKey: 'sigFigs',
    severity: rounding.sigFigsCharge > 0 ? 'error' : 'warning',
    charge: rounding.sigFigsCharge,
    reported: at.reported,
    expected: reference,
    unit: at.unit,
    message:
      `${at.what} is written as ${String(rounding.written)}: that is ${basis} (${withUnit(reference, at.unit)}) rounded to its last written place, ` +
      `so the value itself is right, but the place is coarser than the first significant figure of ${seWords} (${withUnit(se.value, at.unit)}). ` +
      'Give the value to the decimal place of the standard error’s first or second significant figure.',
  };
}

/** The rule for a value written `written`, measured by the student's standard error where they give one, else by ours. */
export function roundingOf(written: NumberLike, theirs: number | undefined, ours: number | undefined, sigFigsCharge: number): Rounding {
  const uncertainty = theirs !== undefined && theirs > 0 ? { value: theirs, ours: false } : ours === undefined ? undefined : { value: ours, ours: true };
  return { written, uncertainty, sigFigsCharge };
}

/** The rule for a standard error as written: never coarser than the first figure of what it is compared with. */
export const roundingOfUncertainty = (written: NumberLike): Rounding => ({ written, uncertainty: 'itself', sigFigsCharge: 0 });
