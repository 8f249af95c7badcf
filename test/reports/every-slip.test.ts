import { describe, expect, it } from 'vitest';
import { Settings } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { rubricBreakdown } from '../../kinds/first-order-catalysis/report/rubric-breakdown.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { printableMessage } from '../../reports/format.ts';
import { plainRich } from '../../reports/pdf/rich-text.ts';
import { slipCase, slipCodes, type SlipCode } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { firstOrderCatalysisReport } from '../../kinds/first-order-catalysis/report/report.ts';
import { feedbackInput } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// Every slip the generator makes, on four assignment variants each (invented data). The generator
// makes the slip; what the checker must say about it is the verdict below, not the generator's label.
const cases = slipCodes.flatMap((code) => [0, 1, 2, 3].map((seed) => ({ code, seed })));

const K = /^runs\[\d\]\.reported\.k$/;
const K_SE = /^runs\[\d\]\.reported\.k\.uncertainty$/;
const LN_F = /^runs\[\d\]\.reported\.lnF$/;

interface Verdict {
  /** The codes of the findings that are errors or warnings (notes and carried-forward lines aside). */
  codes: string[];
  /** Codes that may come as well, at no cost, and why. */
  mayAlso?: { codes: string[]; why: string };
  /** Where points are lost, one finding each. */
  charged: RegExp[];
  pointsLost: number;
}

/**
 * Hand-written verdict per slip, from the slip's definition (submission-generator.ts, each slip's
 * comment) and the rubric's defaults (per run: ln F 1, k 2, its SE 1, a class reading's run 1; k_N 2,
 * its SE 1, k_A 2, its SE 1; significant figures 0). The scoring rule (docs/first-order-catalysis.md):
 * a systematic cause costs once, where it first entered, and values that follow from the student's
 * own numbers keep their points; warnings cost nothing.
 */
const VERDICTS: Record<SlipCode, Verdict> = {
  // One run's k, or k_A, with its sign reversed: that value's 2 points.
  'sign-flipped': { codes: ['sign-flipped'], charged: [/^(runs\[\d\]\.reported\.k|reported\.kA)$/], pointsLost: 2 },
  // log10 for ln in every run's column: systematic, the first column's 1 point; k follows from it.
  'log-base': { codes: ['log-base'], charged: [LN_F], pointsLost: 1 },
  // Per second declared per minute in every run: systematic, one k's 2 points.
  'time-unit': { codes: ['time-unit'], charged: [K], pointsLost: 2 },
  // k_A and its SE 1000 times too small: one cause, charged once, at k_A (2).
  'concentration-unit': { codes: ['concentration-unit'], charged: [/^reported\.kA$/], pointsLost: 2 },
  // One run's k times 10 or 0.1: 2.
  'decimal-shift': { codes: ['decimal-shift'], charged: [K], pointsLost: 2 },
  // Every run's k from t against ln F: systematic, one k's 2 points.
  'swapped-axes': { codes: ['swapped-axes'], charged: [K], pointsLost: 2 },
  // One run's column from the wrong x_inf: its 1 point; its k follows from the column.
  'wrong-infinity': { codes: ['wrong-infinity'], charged: [LN_F], pointsLost: 1 },
  // An intercept where the origin was asked: the invented readings lie on ln F = -kt, so the slope
  // agrees within k's 1 % tolerance and only the SE (another model, one degree of freedom fewer)
  // differs: systematic, one SE's 1 point.
  'fit-model': { codes: ['fit-model'], charged: [K_SE], pointsLost: 1 },
  // One run's k is ln 2 / k: 2.
  'half-life-for-rate': { codes: ['half-life-for-rate'], charged: [K], pointsLost: 2 },
  // Every run's SE is the SD of the points or the 95 % half-width: systematic, one SE's 1 point.
  'uncertainty-kind': {
    codes: ['uncertainty-kind'],
    mayAlso: { codes: ['sig-figs'], why: 'a k to 4 figures can be more precise than the larger uncertainty written beside it (a warning, worth 0)' },
    charged: [K_SE],
    pointsLost: 1,
  },
  // One class reading mis-copied: that run's readings point (1); the analysis follows from the copy.
  transcription: { codes: ['transcription'], charged: [/^runs\[\d\]\.readings(\[\d+\])?$/], pointsLost: 1 },
  // Without a class dataset a reading off the curve is a warning; the analysis of it is right.
  'suspect-reading': { codes: ['suspect-reading'], charged: [], pointsLost: 0 },
  // Data with k_A beyond the band, analysed right: a warning only.
  implausible: { codes: ['implausible'], charged: [], pointsLost: 0 },
  // Significant figures are worth 0 by default: a warning.
  'sig-figs': { codes: ['sig-figs'], charged: [], pointsLost: 0 },
  // An unreadable unit is read as the asked one, where the value is right: a warning.
  'unit-unrecognised': { codes: ['unit-unrecognised'], charged: [], pointsLost: 0 },
  // Normality read as molarity: a warning.
  'unit-assumed': { codes: ['unit-assumed'], charged: [], pointsLost: 0 },
  // k_A left out, and so its SE: both items, 2 + 1.
  'missing-value': { codes: ['missing-value'], charged: [/^reported\.kA$/, /^reported\.kA\.uncertainty$/], pointsLost: 3 },
  // One run's k off by a factor no slip gives: 2.
  unexplained: { codes: ['unexplained'], charged: [K], pointsLost: 2 },
};

/** The maximum by hand: 4 runs x (ln F 1 + k 2 + SE 1) + k_N 2 + SE 1 + k_A 2 + SE 1 = 22, and 1 per run for class readings. */
const maxScoreOf = (classDataset: boolean) => 22 + (classDataset ? 4 : 0);

function checked(code: SlipCode, seed: number) {
  const { settings: input, submission } = slipCase(code, seed);
  const settings = Settings.parse(input);
  return { settings, submission, result: checkSubmission(parseAssignment(settings), submission) };
}

describe('feedback sheets for every kind of slip', () => {
  it.each(cases)('$code, case $seed: the hand-written verdict, a sheet that renders, and rubric items that add up to the score', async ({ code, seed }) => {
    const { settings, submission, result } = checked(code, seed);
    const verdict = VERDICTS[code];
    // Every case is checked: a slip is never a reason to refuse the submission.
    expect(result.status).toBe('checked');
    expect(result.maxScore).toBe(maxScoreOf(settings.classDataset !== undefined));
    const named = new Set(result.findings.filter((f) => f.severity !== 'info').map((f) => f.code));
    for (const extra of verdict.mayAlso?.codes ?? []) named.delete(extra);
    expect([...named].sort()).toEqual(verdict.codes);
    const charged = result.findings.filter((f) => f.pointsLost > 0);
    expect(charged.map((f) => f.severity)).toEqual(verdict.charged.map(() => 'error'));
    charged.forEach((f, i) => expect(f.path).toMatch(verdict.charged[i]));
    expect(result.score).toBe(result.maxScore - verdict.pointsLost);
    const lines = rubricBreakdown(settings, submission, result);
    expect(lines.reduce((sum, l) => sum + l.available, 0)).toBeCloseTo(result.maxScore, 9);
    expect(lines.reduce((sum, l) => sum + l.earned, 0)).toBeCloseTo(result.score!, 9);
    const pdf = await feedbackSheet(feedbackInput(settings, { submission, result }));
    const raw = await pdfText(pdf);
    const text = folded(raw);
    expect(text).toContain(submission.studentId);
    // Every finding shows: the first place of a cause with its message, every other place by name.
    const describe = (path: string) => plainRich(firstOrderCatalysisReport.describePath(path, submission));
    for (const f of result.findings) {
      const message = folded(plainRich(printableMessage(f.message)).slice(0, 50));
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
