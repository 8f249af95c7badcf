import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { assignmentSettings } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { submissionsFor } from '../support/api-fixture.ts';

// Invented submissions; in one run x_inf was never measured, so no ln F column can be made there.
const assignment = parseAssignment(assignmentSettings({ fitModel: 'origin' }));

describe('a run without x_inf', () => {
  it('is not charged for an ln F column it cannot have, and the maximum leaves that column out', () => {
    const [full] = submissionsFor(['S-001'], 3);
    const before = checkSubmission(assignment, full);
    const [sub] = submissionsFor(['S-001'], 3);
    delete sub.runs[1].infinity;
    delete sub.runs[1].reported!.lnF;
    const result = checkSubmission(assignment, sub);
    expect(result.status).toBe('checked');
    expect(result.findings.filter((f) => f.path.startsWith('runs[1].reported.lnF'))).toEqual([]);
    const lnF = assignment.settings as { rubric: { lnF: number } };
    expect(result.maxScore).toBe(before.maxScore - lnF.rubric.lnF);
    expect(result.items).toContainEqual({ item: 'lnF', count: sub.runs.length - 1, each: lnF.rubric.lnF });
  });
});
