import { z } from 'zod';
import type { Finding } from '../../schemas/result.ts';
import type { ExperimentKind } from '../../server/checks/experiment-kind.ts';
import { fitLine } from '../../server/engine/linear-fit.ts';
import type { KindReport } from '../../reports/kind-report.ts';
import { paragraph, sectionHeading } from '../../reports/pdf/document.ts';
import { settingsForm } from '../../reports/display/settings-form.ts';
import { findingWords } from '../../reports/labels.ts';
import { LATE_POLICY_DEFAULT, LatePolicy } from '../../schemas/common.ts';
import { counted } from '../../server/checks/form-lines.ts';

/**
 * A tiny experiment kind that exists only in the test suite, to show that a kind is one registration
 * and nothing else in the service changes: a zero-order decay c = c_0 - k t, one straight line, one
 * reported k. Its own finding code names k reported as the intercept; the rest are shared codes.
 * Invented data only.
 */
export const ZERO_ORDER = 'zero-order-line';

const Settings = z.object({
  kind: z.literal(ZERO_ORDER),
  tolerance: z.number().positive().max(1).default(0.02),
  points: z.number().nonnegative().max(100).default(2),
  late: LatePolicy.default(LATE_POLICY_DEFAULT),
});
type Settings = z.infer<typeof Settings>;

const Submission = z.object({
  studentId: z.string().min(1).max(64),
  points: z.array(z.tuple([z.number(), z.number()])).min(3).max(100),
  reported: z.object({ k: z.number() }),
});
type Submission = z.infer<typeof Submission>;

const near = (a: number, b: number, share: number) => Math.abs(a - b) <= share * Math.abs(b);

export const zeroOrderKind: ExperimentKind<Settings, Submission> = {
  kind: ZERO_ORDER,
  findingCodes: ['intercept-for-slope', 'sign-flipped', 'unexplained'],
  signalCodes: [],
  stages: [{ id: 'line', title: 'The line: k' }],
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues: () => [],
  maxScore: (settings) => settings.points,
  formSummary: (submission) => [`${counted(submission.points.length, 'point')} read`, 'k reported'],
  check(settings, submission) {
    const fit = fitLine(submission.points.map((p) => p[0]), submission.points.map((p) => p[1]));
    const k = -fit.slope;
    const reported = submission.reported.k;
    const finding = (code: string, message: string): Finding => ({
      id: `${code}@reported.k`,
      code,
      stage: 'line',
      path: 'reported.k',
      reported,
      expected: k,
      severity: 'error',
      pointsLost: settings.points,
      rubricItem: 'k',
      message,
    });
    const findings = near(reported, k, settings.tolerance)
      ? []
      : [
          near(reported, -k, settings.tolerance)
            ? finding('sign-flipped', `k is ${reported}; the refit gives ${k}: the sign of the slope was kept, likely.`)
            : near(reported, fit.intercept, settings.tolerance)
              ? finding('intercept-for-slope', `k is ${reported}, the line's intercept; the refit gives ${k}: the intercept was reported as k, likely.`)
              : finding('unexplained', `k is ${reported}; the refit gives ${k}.`),
        ];
    const lost = findings.reduce((sum, f) => sum + f.pointsLost, 0);
    return {
      studentId: submission.studentId,
      status: 'checked',
      score: settings.points - lost,
      maxScore: settings.points,
      items: [{ item: 'k', count: 1, each: settings.points }],
      refit: { k: { value: k, standardError: fit.seSlope }, intercept: fit.intercept },
      findings,
      signals: [],
      rejected: [],
    };
  },
};

/** Its parts of the documents: one line of values on the sheet, one in the summary. */
export const zeroOrderReport: KindReport = {
  description: {
    kind: ZERO_ORDER,
    title: 'A zero-order line',
    quantities: [{ id: 'k', label: 'rate constant', symbol: 'k', unit: 'M s^-1' }],
    settings: { form: settingsForm(Settings, { groups: [{ label: 'Grading', keys: ['tolerance', 'points'] }], kept: [], words: { tolerance: 'Tolerance on k (a share)', points: 'Points for k' } }) },
    upload: { json: true },
    findings: findingWords(['intercept-for-slope', 'sign-flipped', 'unexplained'] as const, { 'intercept-for-slope': 'Intercept given for the slope' }),
    signals: { unit: 'line', reportedValue: 'reported k', codes: [] },
  },
  describePath: (path) => (path === 'reported.k' ? 'k of the line' : path),
  rubricBreakdown: (settings, _submission, result) => {
    const each = (settings as Settings).points;
    const lost = result.findings.reduce((sum, f) => sum + f.pointsLost, 0);
    return [{ item: 'k', label: 'k of the line', count: 1, each, available: each, lost, earned: each - lost }];
  },
  drawSheetData(doc, input) {
    const refit = input.result.refit as { k: { value: number; standardError: number } };
    sectionHeading(doc, 'The zero-order line', 40);
    paragraph(doc, `Refit k = ${refit.k.value.toPrecision(4)} ± ${refit.k.standardError.toPrecision(2)}`);
  },
  display(input) {
    const refit = input.result.refit as { k: { value: number; standardError: number } };
    return { comparison: { caption: 'The zero-order line', note: '', columns: [{ header: 'Refit k', numeric: true }], rows: [[`${refit.k.value.toPrecision(4)} ± ${refit.k.standardError.toPrecision(2)}`]] }, plots: [] };
  },
  summaryFacts: (settings) => [['Tolerance on k', `${(settings as Settings).tolerance * 100} %`]],
  drawSummaryData(doc, input) {
    const ks = input.results.flatMap((r) => (r.refit ? [(r.refit as { k: { value: number } }).k.value] : []));
    sectionHeading(doc, 'The class’s zero-order k', 40);
    paragraph(doc, `Refit k of ${ks.length} students, from ${Math.min(...ks).toPrecision(3)} to ${Math.max(...ks).toPrecision(3)}.`);
  },
};

/** An invented submission: c = 1 - k t at t = 0..5 with a little scatter, and the reported k. */
export function zeroOrderSubmission(studentId: string, k: number, reportedK: number) {
  return { studentId, points: [0, 1, 2, 3, 4, 5].map((t, i) => [t, 1 - k * t + (i % 2 ? 0.0004 : -0.0004)]), reported: { k: reportedK } };
}
