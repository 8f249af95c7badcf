import { EngineError } from '../server/engine/engine-error.ts';
import { convert } from '../server/engine/units.ts';

/**
 * `value` in unit `from` expressed in unit `to`, or undefined when either is not read or they differ
 * in kind: a unit the sheet cannot read only means a line is not drawn, never a different grade.
 * The engine's unit module is pure, so rendering shares its grammar rather than keep a second one.
 */
export function convertUnit(value: number, from: string, to: string): number | undefined {
  try {
    return convert(value, from, to);
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}
