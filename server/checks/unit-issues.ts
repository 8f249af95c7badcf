import type { Rejection } from '../../schemas/result.ts';
import { EngineError } from '../engine/engine-error.ts';
import { parseUnit, type UnitKind } from '../engine/units.ts';

/** Each unit given must parse and be of the kind its place needs: [path, text (absent: not given), kind]. */
export function unitIssues(units: Array<[string, string | undefined, UnitKind]>): Rejection[] {
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
