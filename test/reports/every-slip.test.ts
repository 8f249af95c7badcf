import { describe, expect, it } from 'vitest';
import { Settings } from '../../schemas/kinds/first-order-catalysis.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { rubricBreakdown } from '../../reports/feedback/rubric-breakdown.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { printableMessage } from '../../reports/format.ts';
import { slipCase, slipCodes } from '../../server/demo/submission-generator.ts';
import { firstOrderCatalysisReport } from '../../reports/first-order-catalysis/report.ts';
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
    const pdf = await feedbackSheet(feedbackInput(settings, { submission, result }));
    const raw = await pdfText(pdf);
    const text = folded(raw);
    expect(text).toContain(submission.studentId);
    // Every finding shows: the first place of a cause with its message, every other place by name.
    const describe = (path: string) => firstOrderCatalysisReport.describePath(path, submission).replace(/\^\{([^}]*)\}/g, '$1').replace(/_\{([^}]*)\}/g, '_$1');
    for (const f of result.findings) {
      const message = folded(printableMessage(f.message).slice(0, 50));
      if (!text.includes(message)) expect(text).toContain(folded(describe(f.path)));
    }
    // One card per likely cause: a cause that recurs, in any stage, is one card; a value that only follows
    // from the student's own numbers at no cost is a line, not a card. The rule as the sheet states it,
    // counted here by hand from the findings: codes naming no cause stay one card per place.
    const causes = new Set(
      result.findings
        .filter((f) => !(f.code === 'carried-forward' && f.pointsLost === 0))
        .map((f, i) => (['unexplained', 'refit-note', 'implausible'].includes(f.code) ? `#${i}` : [f.code, ...(f.alsoCodes ?? [])].join('+'))),
    );
    expect(text.match(/(Error|Warning|Info) · /g) ?? []).toHaveLength(causes.size);
    // The checker's paths stay in the JSON; the sheet names places in words.
    expect(text).not.toMatch(/runs\[|points\[|reported\.[A-Za-z]/);
    // No number broken across lines: no line ends in ± or ×, none starts with one or with a power of ten.
    for (const line of raw.split(/\n|\f/)) {
      expect(line).not.toMatch(/[±×]\s*$/);
      expect(line).not.toMatch(/^\s*([±×] |10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹])/);
    }
  });
});
