import type { Refit, RunRefit, Settings, Submission } from '../schemas.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { convertEstimate } from '../../../server/checks/convert-estimate.ts';
import { scoreFindings, type DraftFinding } from '../../../server/checks/draft-finding.ts';
import { InputRejected } from '../../../server/checks/input-rejected.ts';
import { firstOrderCauses } from './causes.ts';
import { checkLnFColumn } from './check-lnf-column.ts';
import { checkReadings } from './check-readings.ts';
import { checkRateLaw, refitRateLaw } from './check-rate-law.ts';
import { checkRunK } from './check-run-k.ts';
import { checkSigFigs } from './check-sig-figs.ts';
import { isFitted, type RunAnalysis, type UnfittedRun } from './run-analysis.ts';
import { runTemperatureDraft } from './run-temperature.ts';
import { analyseRunsAsMeant } from './time-unit-plausibility.ts';
import { theirUngradedK, unfittedRunDraft } from './unfitted-run.ts';
import { digitSignals, runSignals, temperatureSignals } from './run-signals.ts';
import { scoredResult } from '../../../server/checks/scored-result.ts';
import { rateLawGradable, rubricCounts } from './scoring.ts';
import { refitEquilibrium } from './equilibrium-refit.ts';
import { checkEquilibrium } from './check-equilibrium.ts';
import { constantApartSignals } from './equilibrium-signals.ts';

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
function runRefit(a: RunAnalysis | UnfittedRun, declaredUnit: string | undefined, settings: Settings): RunRefit {
  if (!isFitted(a)) return { label: a.label, model: 'exponential', notFitted: a.notFitted.message };
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

export function checkFirstOrderCatalysis(settings: Settings, submitted: Submission): Omit<CheckResult, 'engineVersion'> {
  // Runs whose times cannot be in their declared unit are checked in the unit meant, as a TA reads them.
  const { runs, analyses, drafts: timeUnitDrafts } = analyseRunsAsMeant(submitted.runs, settings);
  const submission = { ...submitted, runs };
  const fitted = analyses.filter(isFitted);
  const unfitted = analyses.filter((a): a is UnfittedRun => !isFitted(a));
  // With no run fitted nothing can be graded: refused, with why each run gave no fit.
  if (fitted.length === 0) throw new InputRejected(unfitted.map((a) => ({ path: a.notFitted.path, message: `run "${a.label}" cannot be fitted: ${a.notFitted.message}` })));
  const drafts: DraftFinding[] = [...unfitted.map(unfittedRunDraft), ...timeUnitDrafts];
  for (const [i, run] of submission.runs.entries()) {
    const temperature = runTemperatureDraft(run, i);
    if (temperature) drafts.push(temperature);
  }
  for (const a of fitted) checkReadings(submission.runs[a.index], a, fitted, settings, drafts);
  const studentKs = analyses.map((a) => {
    const run = submission.runs[a.index];
    // A k we cannot grade (no fit, or undetermined) still belongs in the student's line through their own k_obs.
    if (!isFitted(a)) return theirUngradedK(run, a);
    const column = checkLnFColumn(run, a, fitted, settings, drafts);
    const checked = checkRunK(run, a, fitted, column, settings, drafts);
    return a.undetermined ? theirUngradedK(run, a) : checked;
  });
  const rateLaw = refitRateLaw(analyses, studentKs, settings);
  const undetermined = fitted.filter((a) => a.undetermined);
  const withoutK = [...unfitted, ...undetermined].sort((a, b) => a.index - b.index);
  const named = withoutK.map((a) => `run "${a.label}"`).join(' and ');
  const one = withoutK.length === 1;
  const rateLawLeftOut = !rateLaw && rateLawGradable(submission);
  if (rateLawLeftOut) {
    const why =
      withoutK.length > 0
        ? `without ${named}, which ${one ? 'has' : 'have'} no rate constant to grade against (see the finding${one ? '' : 's'}), fewer than three runs at two concentrations or more remain`
        : 'the k_obs values could not be fitted';
    drafts.push({ code: 'refit-note', path: 'reported', stage: 'rate-law', severity: 'info', charge: 0, message: `k_N and k_A are not graded: ${why}, so the line through the k_obs values is not determined. They are left out of the maximum.` });
  } else if (rateLaw && withoutK.length > 0) {
    drafts.push({
      code: 'refit-note',
      path: 'reported',
      stage: 'rate-law',
      severity: 'info',
      charge: 0,
      message: `k_N and k_A are checked against our line through the other runs' k_obs: ${named} ${one ? 'has' : 'have'} no rate constant of ours (see the finding${one ? '' : 's'}). A line through your own k_obs values, ${one ? "that run's" : "those runs'"} included, is right too.`,
    });
  }
  checkRateLaw(submission, rateLaw, settings, drafts);
  const equilibrium = settings.equilibrium && refitEquilibrium(settings.equilibrium, analyses, rateLaw, settings);
  const equilibriumItems = equilibrium && checkEquilibrium(settings.equilibrium!, equilibrium, analyses, studentKs, submission, settings, drafts);
  checkSigFigs(submission, settings, drafts);

  const findings = scoreFindings(drafts, firstOrderCauses.systematic);
  const items = rubricCounts(settings, submission, { kRuns: undetermined.length, unfittedRuns: unfitted.map((a) => a.index), rateLaw: rateLawLeftOut }, equilibriumItems);
  const refit: Refit = {
    runs: analyses.map((a, i) => runRefit(a, submission.runs[i].reported?.k?.unit, settings)),
    kN: rateLaw?.kN,
    kA: rateLaw?.kA,
    kNDeclared: inDeclared(rateLaw?.kN, submission.reported?.kN?.unit, settings.units.kN),
    kADeclared: inDeclared(rateLaw?.kA, submission.reported?.kA?.unit, settings.units.kA),
    fromReportedK: rateLaw?.fromReportedK,
    weightedFit: rateLaw?.weightedFit,
    ...(equilibrium && { equilibrium }),
  };
  const signals = [...fitted.flatMap((a) => runSignals(a, settings)), ...temperatureSignals(submission.runs, settings), ...digitSignals(fitted, settings), ...(equilibrium ? constantApartSignals(equilibrium) : [])];
  return scoredResult(submission.studentId, items, findings, refit, signals);
}
