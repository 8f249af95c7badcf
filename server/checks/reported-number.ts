import type { ReportedValue } from '../../schemas/common.ts';
import { EngineError } from '../engine/engine-error.ts';
import { convert, parseUnit, type UnitKind } from '../engine/units.ts';
import type { DraftFinding } from './draft-finding.ts';

/**
 * A reported value read in the unit the comparison needs. An unrecognised unit is a finding, and the
 * value is then read as if in the instructor's unit, which the message says.
 */
export interface ReadValue {
  value: number;
  uncertainty?: number;
  /** The unit the numbers are now in. */
  unit: string;
}

export function readReported(
  reported: ReportedValue,
  kind: UnitKind,
  into: string,
  fallbackUnit: string,
  where: { path: string; what: string; stage: DraftFinding['stage'] },
  drafts: DraftFinding[],
): ReadValue {
  let from = reported.unit;
  try {
    parseUnit(from, kind);
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    drafts.push({
      code: 'unit-unrecognised',
      path: where.path,
      stage: 'reporting',
      severity: 'warning',
      charge: 0,
      message: `The unit "${reported.unit}" given for ${where.what} is not recognised (${error.message}); the value was read as ${fallbackUnit}, the unit the assignment asks for. Please write the unit as, for example, ${fallbackUnit}.`,
    });
    from = fallbackUnit;
  }
  return inUnit(reported, from, into);
}

/** The value and its uncertainty (kept positive) converted from `from` into `into`; throws EngineError for a unit that cannot be read. */
function inUnit(reported: ReportedValue, from: string, into: string): ReadValue {
  const f = convert(1, from, into);
  return {
    value: Number(reported.value) * f,
    uncertainty: reported.uncertainty === undefined ? undefined : Math.abs(Number(reported.uncertainty) * f),
    unit: into,
  };
}

/**
 * A reported value in `into` where its own unit can be read, else none: for values that are not
 * graded (a k we have no k of ours for) but still enter the student's own line or fit, so no finding.
 */
export function readableIn(reported: ReportedValue, into: string): ReadValue | undefined {
  try {
    return inUnit(reported, reported.unit, into);
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}
