import type { Factor } from '../../../server/checks/explain.ts';

// 4.184 J per thermochemical calorie (its definition).
const CALORIE = 4.184;

/**
 * A value in joules converted to calories the wrong way (multiplied by 4.184, not divided) and
 * labelled in calories: read in its label's unit it is 4.184 x 4.184 times the refit, so the one
 * slip shows as that square (E_a 103.49 kJ/mol written 433.0 kcal/mol). Only beside a calorie unit.
 */
export function caloriesWrongWay(unit: string): Factor[] {
  if (!/cal/i.test(unit)) return [];
  return [
    {
      factor: CALORIE * CALORIE,
      cause: 'energy-unit',
      says: 'multiplied by 4.184 and labelled in calories, which read as calories is 4.184 × 4.184 = 17.51 times the refit (joules converted to calories the wrong way: calories are joules divided by 4.184)',
    },
  ];
}
