import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { submissionsFor } from '../support/api-fixture.ts';

// Invented submissions. In run 0 the readings fall from 22.44 towards 17.9 (x(t) = 17.9 + 4.54 e^(-0.05 t),
// a reading a minute for 15 minutes, to 0.001 deg), but x_inf is recorded as 30: on the far side of x_0.
const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));
const fallingTowards179 = Array.from({ length: 16 }, (_, t): [number, number] => [t, Number((17.9 + 4.54 * Math.exp(-0.05 * t)).toFixed(3))]);

describe('a run whose rate constant these data do not give', () => {
  it('x_inf on the far side of x_0: a warning on x_inf, nobody marked against a negative k, and the rate law graded on the other runs', () => {
    const [sub] = submissionsFor(['S-001'], 3);
    const [full] = submissionsFor(['S-001'], 3);
    const whole = checkSubmission(assignment, full);
    sub.runs[0] = { ...sub.runs[0], readings: fallingTowards179, infinity: 30, reported: { k: { value: 0.05, uncertainty: 0.001, unit: 'min^-1' } } };
    const result = checkSubmission(assignment, sub);
    expect(result.status).toBe('checked');
    // (The ln F column this student left out is charged as ever: with x_inf given, ln F can be made.)
    const onRun = result.findings.filter((f) => f.path.startsWith('runs[0]') && !f.path.startsWith('runs[0].reported.lnF'));
    expect(onRun).toEqual([expect.objectContaining({ code: 'implausible', severity: 'warning', path: 'runs[0].infinity', pointsLost: 0 })]);
    expect(onRun[0].message).toContain('cannot be negative');
    // The other runs (three or more, at two concentrations or more) still fix the line: k_N and k_A are
    // graded against it, and a note says run 0 is left out of it (common practice, no source).
    expect(sub.runs.length).toBeGreaterThanOrEqual(4);
    const note = result.findings.find((f) => f.code === 'refit-note' && f.path === 'reported');
    expect(note?.message).toContain('checked against our line through the other runs');
    const r = (assignment.settings as { rubric: Record<string, number> }).rubric;
    expect(result.maxScore).toBe(whole.maxScore - r.k - r.kUncertainty);
    expect(result.items?.find((c) => c.item === 'k')?.count).toBe(sub.runs.length - 1);
    expect(result.items?.find((c) => c.item === 'kN')?.count).toBe(1);
  });

  it('a short noisy run without x_inf: k is not told apart from zero, and is not graded', () => {
    const [sub] = submissionsFor(['S-001'], 3);
    // Five readings over 4 minutes with a change of 0.004 deg in 0.003 deg of noise (invented).
    sub.runs[1] = { ...sub.runs[1], readings: [[0, 20.004], [1, 20.006], [2, 20.001], [3, 20.003], [4, 20.0]], infinity: undefined, reported: { k: { value: 0.2, uncertainty: 0.1, unit: 'min^-1' } } };
    const result = checkSubmission(assignment, sub);
    const onRun = result.findings.filter((f) => f.path.startsWith('runs[1]'));
    expect(onRun).toEqual([expect.objectContaining({ code: 'implausible', severity: 'warning', path: 'runs[1].readings' })]);
    expect(onRun[0].message).toContain('do not determine k_obs');
  });
});
