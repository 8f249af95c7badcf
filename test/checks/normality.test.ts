import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { molarForNormality } from '../../kinds/first-order-catalysis/checks/catalyst-unit.ts';

// Invented runs: x(t) = 5 + 15 e^(-k t), k = 0.02 + 0.2 [H+] per min, to 0.001 deg, a reading a
// minute for 15 minutes; k_obs reported as the refit gives them.
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { lnF: 0, kUncertainty: 0 } });
const run = (label: string, value: number, unit: string, acidM: number) => ({
  label,
  catalyst: { value, unit },
  timeUnit: 'min',
  readings: Array.from({ length: 16 }, (_, t) => [t, Number((5 + 15 * Math.exp(-(0.02 + 0.2 * acidM) * t)).toFixed(3))]),
  infinity: 5,
});

describe('a catalyst concentration given as a normality', () => {
  it('reads N, mN and uN as M, mM and uM, and nothing else', () => {
    expect(['N', ' mN ', 'uN', 'µN'].map(molarForNormality)).toEqual(['M', 'mM', 'uM', 'µM']);
    expect(['M', 'n', 'Nm', 'mol/L', 'meq'].map(molarForNormality)).toEqual([undefined, undefined, undefined, undefined, undefined]);
  });

  it('is graded as molarity, with a warning on each such run that says what was assumed', () => {
    const molar = [run('A', 0.1, 'M', 0.1), run('B', 0.2, 'M', 0.2), run('C', 0.3, 'M', 0.3)];
    const normal = [run('A', 0.1, 'N', 0.1), run('B', 200, 'mN', 0.2), run('C', 0.3, 'M', 0.3)];
    const asMolar = checkSubmission(assignment, { studentId: 'N-01', runs: molar });
    const asNormal = checkSubmission(assignment, { studentId: 'N-01', runs: normal });
    expect(asNormal.status).toBe('checked');
    expect(asNormal.refit).toEqual(asMolar.refit);
    const warnings = asNormal.findings.filter((f) => f.code === 'unit-assumed');
    expect(warnings.map((f) => [f.path, f.severity, f.pointsLost])).toEqual([
      ['runs[0].catalyst.unit', 'warning', 0],
      ['runs[1].catalyst.unit', 'warning', 0],
    ]);
    expect(warnings[1].message).toContain('read as mM');
    expect(warnings[1].message).toContain('H2SO4');
  });
});
