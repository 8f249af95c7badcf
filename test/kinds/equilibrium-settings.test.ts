import { describe, expect, it } from 'vitest';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { SettingsError } from '../../server/checks/check.ts';
import { Settings, Submission } from '../../kinds/first-order-catalysis/schemas.ts';

import { glucoseBlock } from '../support/glucose-equilibrium.ts';

/** The first kind's optional equilibrium block (glucose's published rotations: see the support file). */
function refusal(settings: unknown): SettingsError {
  try {
    parseAssignment(settings);
  } catch (error) {
    if (error instanceof SettingsError) return error;
    throw error;
  }
  throw new Error('settings were accepted');
}

describe('the equilibrium block of the first kind', () => {
  it('is optional: settings without it parse as before, with no equilibrium key', () => {
    const settings = Settings.parse({ kind: 'first-order-catalysis', fitModel: 'origin' });
    expect('equilibrium' in settings).toBe(false);
  });

  it('fills its tolerances, rubric and unit by default', () => {
    const settings = Settings.parse({ kind: 'first-order-catalysis', fitModel: 'origin', equilibrium: glucoseBlock });
    expect(settings.equilibrium).toMatchObject({
      pureForms: { A: { value: 112.2, unit: 'deg mL g^-1 dm^-1' }, B: { value: 18.7, unit: 'deg mL g^-1 dm^-1' } },
      rubric: { composition: 1, constant: 1, kSplit: 1, meanK: 1, rateLawSplit: 1 },
      tolerances: { xB: { absolute: 0.005 }, K: { relative: 0.02 } },
    });
  });

  it('refuses A with the smaller specific rotation, naming the field', () => {
    const swapped = { ...glucoseBlock, pureForms: { ...glucoseBlock.pureForms, A: { value: 18.7 }, B: { value: 112.2 } } };
    const error = refusal({ kind: 'first-order-catalysis', fitModel: 'origin', equilibrium: swapped });
    expect(error.issues.map((i) => i.path)).toContain('equilibrium.pureForms.A');
  });

  it('refuses a path length in an unknown unit, naming the field', () => {
    const error = refusal({ kind: 'first-order-catalysis', fitModel: 'origin', equilibrium: { ...glucoseBlock, pathLength: { value: 2, unit: 'in' } } });
    expect(error.issues.map((i) => i.path)).toContain('equilibrium.pathLength.unit');
  });

  it('takes a submission with the composition, K and the split of k per run and for k_N and k_A', () => {
    const v = (value: string, unit = '') => ({ value, unit });
    const parsed = Submission.safeParse({
      studentId: 'E-1',
      runs: [{ label: 'r', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: [[0, 22.44], [1, 21.84], [2, 21.27]], infinity: 10.54, reported: { specificRotation: v('52.7', 'deg mL g^-1 dm^-1'), xB: v('63.6', '%'), K: v('1.75'), kf: v('0.052', 'min^-1'), kr: v('0.030', 'min^-1') } }],
      reported: { K: v('1.75'), kNf: v('0.014', 'min^-1'), kNr: v('0.008', 'min^-1'), kAf: v('0.38', 'M^-1 min^-1'), kAr: v('0.22', 'M^-1 min^-1') },
    });
    expect(parsed.success).toBe(true);
  });
});
