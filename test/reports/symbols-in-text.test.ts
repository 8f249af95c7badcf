import { describe, expect, it } from 'vitest';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import type { KindSettings } from '../../reports/feedback-input.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { slipCase, slipCodes } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { temperatureSlips, temperatureSubmission } from '../../kinds/temperature-dependence/demo/submission-generator.ts';
import { GRADED_AT } from './fixtures.ts';
import { pdfText } from '../support/pdf-reading.ts';

// Invented data: the generators' students, one with each slip each kind's generator makes. What must
// not be read on any page is hand-written from the issue: the checker's plain symbols (k_obs, x_inf,
// E_a), caret exponents (min^-1) and its paths (runs[0].reported.k, points[2].k).
// A path's `reported.` is followed by a field name; "was not reported." ends a sentence.
const FORBIDDEN = [/_obs/, /_inf/, /x_0/, /E_a/, /k_N/, /k_A/, /k_B/, /\^-/, /\^\(/, /runs\[/, /points\[/, /reported\.[A-Za-z]/];
const header = { course: 'Kinetics laboratory (invented)', section: 'Thursday B', assignment: 'Invented', gradedAt: GRADED_AT };

interface Checked {
  settings: KindSettings;
  submission: { studentId: string };
  result: CheckResult;
}

function check(settings: unknown, submission: { studentId: string }): Checked {
  const assignment = parseAssignment(settings);
  return { settings: assignment.settings as KindSettings, submission, result: checkSubmission(assignment, submission) };
}

async function expectSymbolsPrinted(cases: Checked[]): Promise<void> {
  const expectClean = (text: string, what: string) => {
    for (const code of FORBIDDEN) expect(text, `${what} prints ${code.source}`).not.toMatch(code);
  };
  for (const c of cases) {
    const sheet = await feedbackSheet({ header: { ...header, studentId: c.submission.studentId, version: 1 }, settings: c.settings, submission: c.submission, result: c.result, invented: true });
    expectClean(await pdfText(sheet), `the sheet of ${c.submission.studentId} (${c.result.findings.map((f) => f.code).join(', ')})`);
  }
  const summary = await sectionSummary({ header, settings: cases[0].settings, results: cases.map((c) => c.result), submissions: cases.map((c) => c.submission), invented: true });
  expectClean(await pdfText(summary), 'the summary');
}

describe('running text prints symbols with their sub- and superscripts, never in the checker’s plain form', () => {
  it('first-order catalysis: a sheet for every slip, and the summary', async () => {
    await expectSymbolsPrinted(slipCodes.map((code) => {
      const { settings, submission } = slipCase(code, 0);
      return check(settings, submission);
    }));
  }, 120_000);

  it('temperature dependence: a clean sheet and one for every slip, and the summary', async () => {
    const random = seededRandom(20261203);
    await expectSymbolsPrinted([undefined, ...temperatureSlips].map((slip, n) => check({ kind: 'temperature-dependence' }, temperatureSubmission(random, `T-${n + 1}`, slip))));
  }, 120_000);
});
