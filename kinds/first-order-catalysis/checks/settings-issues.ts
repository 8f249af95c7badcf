import type { Settings } from '../schemas.ts';
import type { Rejection } from '../../../schemas/result.ts';
import type { UnitKind } from '../../../server/engine/units.ts';
import { unitIssues } from '../../../server/checks/unit-issues.ts';

/** Every unit in the settings must parse, and be of the kind its place needs. */
export function settingsIssues(settings: Settings): Rejection[] {
  const units: Array<[string, string | undefined, UnitKind]> = [
    ['units.k', settings.units.k, 'first-order-rate'],
    ['units.kN', settings.units.kN, 'first-order-rate'],
    ['units.kA', settings.units.kA, 'second-order-rate'],
    ['reference.kN.unit', settings.reference?.kN?.unit, 'first-order-rate'],
    ['reference.kA.unit', settings.reference?.kA?.unit, 'second-order-rate'],
    ...(settings.classDataset?.runs ?? []).flatMap((run, i): Array<[string, string, UnitKind]> => [
      [`classDataset.runs[${i}].timeUnit`, run.timeUnit, 'time'],
      [`classDataset.runs[${i}].catalyst.unit`, run.catalyst.unit, 'concentration'],
    ]),
  ];
  return unitIssues(units);
}
