import { decimalsOf } from '../engine/decimal-places.ts';

/** The step a run's readings are written to: one unit in the last decimal place any of them shows. */
export function displayStepOf(readings: number[]): number {
  return 10 ** -Math.max(...readings.map(decimalsOf));
}
