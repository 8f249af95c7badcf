import type { Settings } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { Rejection } from '../../../schemas/result.ts';
import { EngineError } from '../../engine/engine-error.ts';
import { parseUnit, type UnitKind } from '../../engine/units.ts';

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
  const issues: Rejection[] = [];
  for (const [path, text, kind] of units) {
    if (text === undefined) continue;
    try {
      parseUnit(text, kind);
    } catch (error) {
      if (!(error instanceof EngineError)) throw error;
      issues.push({ path, message: error.message });
    }
  }
  return issues;
}
