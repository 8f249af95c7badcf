import { describe, expect, it } from 'vitest';
import { Settings } from '../../schemas/kinds/first-order-catalysis.ts';
import { checkSubmission, parseAssignment } from '../../server/checks/check.ts';
import { rubricBreakdown } from '../../reports/feedback/rubric-breakdown.ts';
import { renderFeedbackSheet } from '../../reports/feedback-sheet.ts';
import { printableMessage } from '../../reports/format.ts';
import { slipCase, slipCodes } from '../../server/demo/submission-generator.ts';
import { feedbackInput } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// Every slip the generator makes, on four assignment variants each (invented data).
const cases = slipCodes.flatMap((code) => [0, 1, 2, 3].map((seed) => ({ code, seed })));

describe('feedback sheets for every kind of slip', () => {
  it.each(cases)('$code, case $seed: renders, and the rubric items add up to the score', async ({ code, seed }) => {
    const { settings: input, submission } = slipCase(code, seed);
    const settings = Settings.parse(input);
    const result = checkSubmission(parseAssignment(settings), submission);
    const lines = rubricBreakdown(settings, submission, result);
    if (result.status === 'checked') {
      expect(lines.reduce((sum, l) => sum + l.available, 0)).toBeCloseTo(result.maxScore, 9);
      expect(lines.reduce((sum, l) => sum + l.earned, 0)).toBeCloseTo(result.score!, 9);
    }
    const pdf = await renderFeedbackSheet(feedbackInput(settings, { submission, result }));
    const text = folded(await pdfText(pdf));
    expect(text).toContain(submission.studentId);
    for (const f of result.findings) expect(text).toContain(folded(printableMessage(f.message).slice(0, 50)));
  });
});
