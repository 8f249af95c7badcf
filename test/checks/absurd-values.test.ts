import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { submissionsFor } from '../support/api-fixture.ts';

// Invented submissions with values no analysis of the data could give.
const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));
const codesAt = (sub: unknown) => checkSubmission(assignment, sub).findings.filter((f) => f.severity === 'error').map((f) => `${f.code} ${f.path}`);

describe('absurd magnitudes', () => {
  it.each([
    [2.8e19, 21],
    [1e308, 310],
  ])('a k_obs reported as %d is named implausible, about 10^%i times the refit, not a slip of method', (value, orders) => {
    const [sub] = submissionsFor(['S-001'], 3);
    sub.runs[1].reported!.k!.value = value;
    const result = checkSubmission(assignment, sub);
    const finding = result.findings.find((f) => f.path === 'runs[1].reported.k')!;
    expect(finding).toMatchObject({ code: 'implausible', severity: 'error' });
    expect(finding.message).toMatch(new RegExp(`about 10\\^(${orders - 1}|${orders}|${orders + 1}) times the refit`));
    expect(result.score).toBeLessThan(result.maxScore);
  });

  it('a catalyst concentration of 1e308 M is named implausible at that value', () => {
    const [sub] = submissionsFor(['S-001'], 3);
    sub.runs[2].catalyst.value = 1e308;
    expect(codesAt(sub)).toContain('implausible runs[2].catalyst.value');
  });

  // Hand-written verdicts: a k_obs scaled by a factor a common slip gives is named by that slip, at the
  // run's k only, and costs the rubric's points for one k (2 by default); the other values are right.
  // The maximum, 22, is 4 runs x (ln F 1 + k 2 + its SE 1) + k_N 2 + its SE 1 + k_A 2 + its SE 1.
  it.each([
    { factor: 60, named: 'sixty', code: 'time-unit', says: 'multiplied by 60' },
    { factor: 3600, named: 'three thousand six hundred', code: 'time-unit', says: 'multiplied by 3600' },
    { factor: 1000, named: 'a thousand', code: 'decimal-shift', says: 'multiplied by 1000' },
  ])('a k $named times off is read as a slip ($code), not as absurd', ({ factor, code, says }) => {
    const [sub] = submissionsFor(['S-001'], 3);
    sub.runs[0].reported!.k!.value = Number(sub.runs[0].reported!.k!.value) * factor;
    const result = checkSubmission(assignment, sub);
    expect(result.findings.map((f) => [f.code, f.path, f.severity, f.pointsLost])).toEqual([[code, 'runs[0].reported.k', 'error', 2]]);
    expect(result.findings[0].message).toContain(says);
    expect([result.score, result.maxScore]).toEqual([20, 22]);
  });
});
