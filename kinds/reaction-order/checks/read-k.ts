import type { ReportedValue } from '../../../schemas/common.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { readReported, type ReadValue } from '../../../server/checks/reported-number.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { convert, parseUnit, type UnitKind } from '../../../server/engine/units.ts';
import type { LawOrder } from '../integrated-laws.ts';
import { kUnitOf, ORDERS } from '../order-analysis.ts';
import type { Settings } from '../schemas.ts';

const RATE_KIND: Record<LawOrder, UnitKind> = { 0: 'zero-order-rate', 1: 'first-order-rate', 2: 'second-order-rate' };

function parsedKind(text: string): UnitKind | undefined {
  try {
    return parseUnit(text).kind;
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

/**
 * The reported k in the instructor's unit for the reported order. A unit that fits another order
 * (min^-1 beside order 2) is a finding, and the number is then read with that unit's time part, as
 * the unit of the order reported: M^-1 min^-1 for min^-1 there.
 */
export function readK(reported: ReportedValue, order: LawOrder, settings: Settings, drafts: DraftFinding[]): ReadValue {
  const unit = kUnitOf(order, settings.units.time);
  const where = { path: 'reported.k', what: 'k', stage: 'order' };
  const kind = parsedKind(reported.unit);
  const other = ORDERS.find((n) => n !== order && RATE_KIND[n] === kind);
  if (other === undefined) return readReported(reported, RATE_KIND[order], unit, unit, where, drafts);
  const f = convert(1, reported.unit, kUnitOf(other, settings.units.time));
  const charge = settings.rubric.kUnit;
  drafts.push({
    code: 'k-unit-order',
    path: 'reported.k.unit',
    stage: 'order',
    rubricItem: 'kUnit',
    itemKey: 'kUnit',
    severity: charge > 0 ? 'error' : 'warning',
    charge,
    message: `The unit of k, ${reported.unit}, is the unit of a rate constant of order ${other}, but you report order ${order}, whose k is in ${unit} (M^(1−n) per time unit, from −d[A]/dt = k[A]^n). The value is read as ${unit}. Please check the unit against the order.`,
  });
  return { value: Number(reported.value) * f, uncertainty: reported.uncertainty === undefined ? undefined : Math.abs(Number(reported.uncertainty) * f), unit };
}
