import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../server/demo/submission-generator.ts';
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

  it('a k a thousand times off is still read as a slip of units, not as absurd', () => {
    const [sub] = submissionsFor(['S-001'], 3);
    sub.runs[0].reported!.k!.value = Number(sub.runs[0].reported!.k!.value) * 60;
    expect(codesAt(sub)).toContain('time-unit runs[0].reported.k');
  });
});
