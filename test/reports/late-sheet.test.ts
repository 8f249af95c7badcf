import { describe, expect, it } from 'vitest';
import { feedbackSheet } from '../../kinds/documents.ts';
import { applyLatePolicy } from '../../server/grading/late-policy.ts';
import { formatPoints } from '../../reports/format.ts';
import { feedbackInput, section } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// Invented data: the seeded generator's section, one student with a log-base slip, handed in late.
describe('a late submission’s sheet under deduct', () => {
  it('prints the late finding under "Handing in", its row in the rubric table, and the score less the points', async () => {
    const s = section(7, [undefined, 'log-base']);
    const student = s.students[1];
    const late = applyLatePolicy(student.result, { policy: 'deduct', points: 2 }, true);
    // Hand-worked: the score as checked less 2, the maximum the same.
    expect(late.score).toBe(Math.max(0, student.result.score! - 2));
    const flat = folded(await pdfText(await feedbackSheet(feedbackInput(s.settings, { ...student, result: late }))));
    expect(flat).toContain('Handing in');
    expect(flat).toContain('Submitted after the deadline');
    expect(flat).toContain('Late work, off the score');
    expect(flat).toContain(`${formatPoints(late.score!)} / ${formatPoints(student.result.maxScore)}`);
  });
});
