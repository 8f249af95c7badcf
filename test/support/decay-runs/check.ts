import type { Finding, Signal } from '../../../schemas/result.ts';
import { scoredResult } from '../../../server/checks/scored-result.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { fitFirstOrderLinear } from '../../../server/engine/first-order-linear.ts';
import type { Refit, Settings, Submission } from './schemas.ts';

const near = (a: number, b: number, share: number) => Math.abs(a - b) <= share * Math.abs(b);

/** What a reported k off the refit most likely is: the sign kept, log10 F used, the half-life given; or none of these. */
function causeOf(reported: number, k: number, tolerance: number): { code: string; why: string } {
  if (near(reported, -k, tolerance)) return { code: 'sign-flipped', why: 'the slope of ln F was reported with its sign, likely' };
  if (near(reported, k / Math.LN10, tolerance)) return { code: 'log-base', why: 'the slope of log10 F was reported, likely (k/ln 10)' };
  if (near(reported, Math.LN2 / k, tolerance)) return { code: 'half-life-for-k', why: 'the half-life ln 2/k was reported as k, likely' };
  return { code: 'unexplained', why: 'no common slip explains it' };
}

/** Each run fitted through ln F = ln[(x − x_inf)/(x_0 − x_inf)] against t, its reported k compared with the refit's. */
export function checkDecayRuns(settings: Settings, submission: Submission) {
  const findings: Finding[] = [];
  const signals: Signal[] = [];
  const runs: Refit['runs'] = submission.runs.map((run, i) => {
    const path = `runs[${i}]`;
    if (run.readings.length < settings.minReadings) {
      signals.push({ code: 'few-readings', path: `${path}.readings`, message: `Run “${run.label}” has ${run.readings.length} readings; the assignment asks for ${settings.minReadings}.`, evidence: { readings: run.readings.length, minReadings: settings.minReadings } });
    }
    const finding = (code: string, message: string, reported: number, expected: number | null): Finding => ({
      id: `${code}@${path}.reported.k`,
      code,
      stage: 'runs',
      path: `${path}.reported.k`,
      reported,
      expected,
      severity: 'error',
      pointsLost: settings.pointsPerRun,
      rubricItem: 'k',
      itemKey: `k@${path}`,
      message,
    });
    const reported = run.reported.k.value;
    try {
      const fit = fitFirstOrderLinear({ times: run.readings.map((r) => r[0]), readings: run.readings.map((r) => r[1]), timeUnit: run.timeUnit, infinity: run.infinity }, 'intercept');
      const k = fit.k.value;
      if (!near(reported, k, settings.tolerance)) {
        const { code, why } = causeOf(reported, k, settings.tolerance);
        findings.push(finding(code, `k of run “${run.label}” is ${reported}; the refit gives ${k.toPrecision(4)}: ${why}.`, reported, k));
      }
      return { label: run.label, k: { value: k, standardError: fit.k.standardError, unit: fit.k.unit }, interceptLnF: fit.interceptLnF.value };
    } catch (error) {
      if (!(error instanceof EngineError)) throw error;
      findings.push(finding('unexplained', `Run “${run.label}” cannot be refitted: ${error.message}.`, reported, null));
      return { label: run.label, k: null, interceptLnF: null };
    }
  });
  const items = [{ item: 'k', count: submission.runs.length, each: settings.pointsPerRun }];
  return scoredResult(submission.studentId, items, findings, { runs }, signals);
}
