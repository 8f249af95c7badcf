import type { Band } from '../../schemas/common.ts';
import { convert } from '../engine/units.ts';
import type { DraftFinding } from './draft-finding.ts';
import { fmt } from './format.ts';

/**
 * An `implausible` warning (no points) when `value` (in `unit`) lies outside the band; undefined when
 * it lies within. `advice` ends the message with what the kind suggests checking.
 */
export function outsideBand(band: Band, value: number, unit: string, where: { label: string; path: string; stage: string; advice: string }): DraftFinding | undefined {
  const inBand = convert(value, unit, band.unit);
  if (inBand >= band.min && inBand <= band.max) return undefined;
  return {
    code: 'implausible',
    path: where.path,
    stage: where.stage,
    severity: 'warning',
    charge: 0,
    reported: value,
    unit,
    message: `${where.label} = ${fmt(inBand)} ${band.unit} lies outside the range expected for this experiment, ${fmt(band.min)} to ${fmt(band.max)} ${band.unit}. ${where.advice}`,
  };
}
