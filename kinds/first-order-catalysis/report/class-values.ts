import type { Settings, Submission } from '../schemas.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { readRefit } from './refit.ts';
import { convertUnit } from '../../../reports/units.ts';

/**
 * The section's k_N and k_A, in the instructor's units: our refit of each student's data, and (when
 * the submissions are given) the values the students reported. A reported value whose unit is not
 * read here is left out and counted.
 */
export interface ClassValues {
  quantity: 'kN' | 'kA' | 'K';
  /** What one mark stands for: a student, or (for K) one run of a student. */
  per?: string;
  unit: string;
  refit: number[];
  reported: number[];
  /** Reported values left out because their unit could not be read. */
  unreadable: number;
  band?: { min: number; max: number };
}

export function classValues(settings: Settings, results: readonly CheckResult[], submissions: readonly Submission[] | undefined): ClassValues[] {
  const byId = new Map<string, Submission>();
  for (const s of submissions ?? []) if (!byId.has(s.studentId)) byId.set(s.studentId, s);
  return (['kN', 'kA'] as const).map((quantity) => {
    const unit = settings.units[quantity];
    const values: ClassValues = { quantity, unit, refit: [], reported: [], unreadable: 0 };
    for (const result of results) {
      if (result.status !== 'checked') continue;
      const estimate = readRefit(result)?.[quantity];
      const ours = estimate && convertUnit(estimate.value, estimate.unit, unit);
      if (ours !== undefined) values.refit.push(ours);
      const reported = result.studentId === null ? undefined : byId.get(result.studentId)?.reported?.[quantity];
      if (reported) {
        const theirs = convertUnit(Number(reported.value), reported.unit, unit);
        if (theirs === undefined) values.unreadable += 1;
        else values.reported.push(theirs);
      }
    }
    const band = settings.reference?.[quantity];
    if (band) {
      const min = convertUnit(band.min, band.unit, unit);
      const max = convertUnit(band.max, band.unit, unit);
      if (min !== undefined && max !== undefined) values.band = { min: Math.min(min, max), max: Math.max(min, max) };
    }
    return values;
  });
}
