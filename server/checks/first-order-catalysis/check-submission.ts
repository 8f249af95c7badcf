import type { Refit, RunRefit, Settings, Submission } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { EngineError } from '../../engine/engine-error.ts';
import type { Estimate } from '../../engine/estimate.ts';
import { convertEstimate } from '../convert-estimate.ts';
import { scoreFindings, type DraftFinding } from '../draft-finding.ts';
import { firstOrderCauses } from './causes.ts';
import { checkLnFColumn } from './check-lnf-column.ts';
import { checkReadings } from './check-readings.ts';
import { checkRateLaw, refitRateLaw } from './check-rate-law.ts';
import { checkRunK } from './check-run-k.ts';
import { checkSigFigs } from './check-sig-figs.ts';
import { analyseRun, type RunAnalysis } from './run-analysis.ts';
import { digitSignals, runSignals, temperatureSignals } from './run-signals.ts';
import { itemPoints, scoredResult } from '../scored-result.ts';
import { rateLawGradable, rubricCounts } from './scoring.ts';

/** An estimate in the unit a student declared, where that differs from the instructor's and can be read. */
function inDeclared(e: Estimate | undefined, declared: string | undefined, instructor: string): Estimate | undefined {
  if (!e || !declared || declared === instructor) return undefined;
  try {
    return convertEstimate(e, declared);
  } catch (error) {
    // A declared unit that cannot be read is reported as a finding; the refit just omits it.
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

/** Our values for one run: in the instructor's unit, and in the unit the student declared where it differs. */
function runRefit(a: RunAnalysis, declaredUnit: string | undefined, settings: Settings): RunRefit {
  const declared = inDeclared(a.expected, declaredUnit, settings.units.k);
  return {
    label: a.label,
    model: a.asked ? a.asked.model : 'exponential',
    k: { instructor: convertEstimate(a.expected, settings.units.k), ...(declared ? { declared } : {}) },
    kOtherModel: a.other ? convertEstimate(a.other.k, settings.units.k) : undefined,
    kExponential: a.exponential ? convertEstimate(a.exponential.k, settings.units.k) : undefined,
    // A rate interval reaching zero leaves the half-life unbounded, which JSON cannot carry.
    halfLife: [a.asked?.halfLife ?? a.exponential?.halfLife].find((h) => h !== undefined && Number.isFinite(h.ci95[1])),
    // NaN (a reading past x_inf) travels as null in JSON.
    lnF: a.transform?.lnF.map((v) => (Number.isFinite(v) ? v : null)),
    residualSD: a.asked?.line.residualSD,
  };
}

export function checkFirstOrderCatalysis(settings: Settings, submission: Submission): Omit<CheckResult, 'engineVersion'> {
  const analyses = submission.runs.map((run, i) => analyseRun(run, i, settings.fitModel));
  const drafts: DraftFinding[] = [];
  submission.runs.forEach((run, i) => checkReadings(run, analyses[i], analyses, settings, drafts));
  const studentKs = submission.runs.map((run, i) => {
    const column = checkLnFColumn(run, analyses[i], analyses, settings, drafts);
    return checkRunK(run, analyses[i], analyses, column, settings, drafts);
  });
  const rateLaw = refitRateLaw(analyses, studentKs, settings);
  const undetermined = analyses.filter((a) => a.undetermined);
  const rateLawLeftOut = !rateLaw && rateLawGradable(submission);
  if (rateLawLeftOut) {
    const why = undetermined.length > 0 ? `run "${undetermined[0].label}" has no rate constant to grade against (see the finding on that run)` : 'the k_obs values could not be fitted';
    drafts.push({ code: 'refit-note', path: 'reported', stage: 'rate-law', severity: 'info', charge: 0, message: `k_N and k_A are not graded: ${why}, so the line through the k_obs values is not determined. They are left out of the maximum.` });
  }
  checkRateLaw(submission, rateLaw, settings, drafts);
  checkSigFigs(submission, settings, drafts);

  const findings = scoreFindings(drafts, (key) => itemPoints(settings.rubric, key), firstOrderCauses.systematic);
  const items = rubricCounts(settings, submission, { kRuns: undetermined.length, rateLaw: rateLawLeftOut });
  const refit: Refit = {
    runs: analyses.map((a, i) => runRefit(a, submission.runs[i].reported?.k?.unit, settings)),
    kN: rateLaw?.kN,
    kA: rateLaw?.kA,
    kNDeclared: inDeclared(rateLaw?.kN, submission.reported?.kN?.unit, settings.units.kN),
    kADeclared: inDeclared(rateLaw?.kA, submission.reported?.kA?.unit, settings.units.kA),
    fromReportedK: rateLaw?.fromReportedK,
    weightedFit: rateLaw?.weightedFit,
  };
  const signals = [...analyses.flatMap((a) => runSignals(a, settings)), ...temperatureSignals(submission.runs, settings), ...digitSignals(analyses, settings)];
  return scoredResult(submission.studentId, items, findings, refit, signals);
}
