import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { fitGuggenheim } from '../../server/engine/guggenheim.ts';
import { fitFirstOrderNonlinear } from '../../server/engine/first-order-nonlinear.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { submissionsFor } from '../support/api-fixture.ts';
import { thrown } from '../support/thrown.ts';

// Invented: a run without x_inf read at irregular times (0, 1.1, 2.3, 3.2, 4.6 ... min), which the
// Guggenheim method cannot pair; x(t) = 10.54 + 11.9 e^(-0.2 t), to 0.001 deg.
const times = [0, 1.1, 2.3, 3.2, 4.6, 5.5, 6.8, 7.7, 9.1, 10.4, 11.2, 12.9, 13.6, 15.0];
const readings = times.map((t): [number, number] => [t, Number((10.54 + 11.9 * Math.exp(-0.2 * t)).toFixed(3))]);
const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));

describe('a run without x_inf that the Guggenheim method cannot pair', () => {
  it('is graded against the exponential fit, not refused', () => {
    const run = { times, readings: readings.map(([, x]) => x), timeUnit: 'min' };
    expect(thrown(() => fitGuggenheim(run)).message).toMatch(/pairs/);
    const k = fitFirstOrderNonlinear(run, { infinity: 'fitted' }).k.value;
    const [sub] = submissionsFor(['S-001'], 3);
    sub.runs[2] = { ...sub.runs[2], readings, infinity: undefined, reported: { k: { value: Number(k.toPrecision(4)), uncertainty: 0.001, unit: 'min^-1' } } };
    const result = checkSubmission(assignment, sub);
    expect(result.status).toBe('checked');
    expect(result.findings.filter((f) => f.path === 'runs[2].reported.k')).toEqual([]);
    expect(k).toBeCloseTo(0.2, 2);
  });
});
