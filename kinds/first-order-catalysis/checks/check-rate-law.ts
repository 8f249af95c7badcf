import type { ReportedValue } from '../../../schemas/common.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import { outsideBand } from '../../../server/checks/reference-band.ts';
import { firstOrderCauses } from './causes.ts';
import { fitCatalysisLaw, type CatalysisFit } from '../catalysis-law.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { convert, rateUnitOf, type UnitKind } from '../../../server/engine/units.ts';
import { slipMatch } from '../../../server/checks/cause-tolerance.ts';
import { checkValue } from '../../../server/checks/check-value.ts';
import { roundingOf, roundingOfUncertainty } from '../../../server/checks/rounding-rule.ts';
import { convertEstimate } from '../../../server/checks/convert-estimate.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { CONCENTRATION_UNIT, DECIMAL_SHIFT, LOG_BASE, SIGN, TIME_UNIT, type Candidate } from '../../../server/checks/explain.ts';
import { fmt, withUnit } from '../../../server/checks/format.ts';
import { withinTolerance } from '../../../server/checks/tolerance.ts';
import { readReported } from '../../../server/checks/reported-number.ts';
import type { StudentK } from './check-run-k.ts';
import { isFitted, type RunAnalysis, type RunOutcome } from './run-analysis.ts';

/** k_N and k_A from our refit, and from the student's own k_obs values where they gave them all. */
export interface RateLawRefit {
  kN: Estimate;
  kA: Estimate;
  fromReportedK?: { kN: Estimate; kA: Estimate };
  /** Why the ordinary fit stands in for the weighted one the settings ask for, when it does. */
  unweightedBecause?: string;
  weightedFit?: Refit['weightedFit'];
}

// The fit runs in base units (M, s^-1) and its results are converted to the instructor's units.
const BASE = { concentration: 'M', time: 's' };

interface InUnits {
  kN: Estimate;
  kA: Estimate;
  weightedFit?: Refit['weightedFit'];
}

/** k_N and k_A in the instructor's units, with standard errors in the convention the settings name first. */
function fitInUnits(points: Array<{ c: number; k: number; se?: number }>, weighted: boolean, settings: Settings): InUnits {
  const fit: CatalysisFit = fitCatalysisLaw(
    points.map((p) => ({ concentration: p.c, k: p.k, standardError: p.se })),
    { units: BASE, weighted },
  );
  const inUnits = (f: { kN: Estimate; kA: Estimate }) => ({ kN: convertEstimate(f.kN, settings.units.kN), kA: convertEstimate(f.kA, settings.units.kA) });
  const absolute = inUnits(fit);
  if (!fit.scaled) return absolute;
  const scaled = inUnits(fit.scaled);
  const convention = settings.weightedErrors === 'scaled' ? 'scaled' : 'absolute';
  const [used, other] = convention === 'scaled' ? [scaled, absolute] : [absolute, scaled];
  return {
    ...used,
    weightedFit: { reducedChiSquared: fit.scaled.reducedChiSquared, convention, otherConvention: { kN: other.kN.standardError, kA: other.kA.standardError } },
  };
}

export function refitRateLaw(analyses: RunOutcome[], studentKs: Array<StudentK | undefined>, settings: Settings): RateLawRefit | undefined {
  // Our line leaves out a run with no rate constant of its own (not fitted, or undetermined); with
  // fewer than three runs at two concentrations left, the fit below refuses and nothing is graded.
  const graded = analyses.filter((a): a is RunAnalysis => isFitted(a) && !a.undetermined);
  const weighted = settings.rateLawFit === 'weighted';
  const perSecond = (a: RunOutcome, k: number) => convert(k, rateUnitOf(a.timeUnit), 's^-1');
  try {
    const points = graded.map((a) => ({ c: a.concentrationM, k: perSecond(a, a.expected.value), se: perSecond(a, a.expected.standardError) }));
    // Weights are 1/SE^2: a run fitted exactly (SE 0) would take all the weight. The ordinary fit
    // stands in, and a finding says so, rather than leave k_N and k_A unchecked.
    const exact = weighted ? graded.find((_, i) => !(points[i].se > 0)) : undefined;
    const unweightedBecause = exact && `the standard error of k_obs of run "${exact.label}" is 0 (its readings lie exactly on the curve), so weights 1/SE² cannot be formed`;
    const ours = fitInUnits(points, weighted && !exact, settings);
    let fromReportedK: RateLawRefit['fromReportedK'];
    if (studentKs.every((k) => k !== undefined)) {
      const canWeight = weighted && studentKs.every((k) => k!.uncertainty !== undefined && k!.uncertainty > 0);
      const theirs = fitInUnits(
        analyses.map((a, i) => ({ c: a.concentrationM, k: perSecond(a, studentKs[i]!.value), se: canWeight ? perSecond(a, studentKs[i]!.uncertainty!) : undefined })),
        canWeight,
        settings,
      );
      fromReportedK = { kN: theirs.kN, kA: theirs.kA };
    }
    return { kN: ours.kN, kA: ours.kA, fromReportedK, unweightedBecause, weightedFit: ours.weightedFit };
  } catch (error) {
    // Fewer than three runs, or all at one concentration: there is no second stage to grade.
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

interface Constant {
  name: 'kN' | 'kA';
  label: string;
  unitKind: UnitKind;
}
const CONSTANTS: Constant[] = [
  { name: 'kN', label: 'k_N', unitKind: 'first-order-rate' },
  { name: 'kA', label: 'k_A', unitKind: 'second-order-rate' },
];

function missingUncertainty(c: Constant, path: string, item: 'kNUncertainty' | 'kAUncertainty', charge: number, drafts: DraftFinding[]): void {
  if (charge > 0) {
    drafts.push({ code: 'missing-value', path: `${path}.uncertainty`, stage: 'rate-law', rubricItem: item, itemKey: item, severity: 'error', charge, message: `The standard error of ${c.label} is missing.` });
  }
}

function checkConstant(c: Constant, reported: ReportedValue | undefined, refit: RateLawRefit, settings: Settings, drafts: DraftFinding[]): void {
  const path = `reported.${c.name}`;
  const { rubric, tolerances } = settings;
  const uncertaintyItem = c.name === 'kN' ? 'kNUncertainty' : 'kAUncertainty';
  if (!reported) {
    // An absent value has no standard error either: both rubric items are unearned.
    if (rubric[c.name] > 0) {
      drafts.push({ code: 'missing-value', path, stage: 'rate-law', rubricItem: c.name, itemKey: c.name, severity: 'error', charge: rubric[c.name], message: `${c.label} is missing.` });
    }
    missingUncertainty(c, path, uncertaintyItem, rubric[uncertaintyItem], drafts);
    return;
  }
  const unit = settings.units[c.name];
  const read = readReported(reported, c.unitKind, unit, unit, { path, what: c.label, stage: 'rate-law' }, drafts);
  const ours = refit[c.name];
  const theirs = refit.fromReportedK?.[c.name];
  const factors = [SIGN, LOG_BASE, ...TIME_UNIT, ...(c.name === 'kA' ? CONCENTRATION_UNIT : []), ...DECIMAL_SHIFT];
  const from = 'your own k_obs values';
  const outcome = checkValue(
    {
      what: c.label,
      path,
      stage: 'rate-law',
      rubricItem: c.name,
      itemKey: c.name,
      charge: rubric[c.name],
      reported: read.value,
      unit,
      expected: ours.value,
      carriedForward: theirs && { value: theirs.value, from },
      factors,
      causes: firstOrderCauses,
      tolerance: tolerances[c.name],
      rounding: roundingOf(reported.value, read.uncertainty, ours.standardError, rubric.sigFigs),
    },
    drafts,
  );
  if (read.uncertainty === undefined) {
    missingUncertainty(c, path, uncertaintyItem, rubric[uncertaintyItem], drafts);
  } else {
    const spread: Candidate[] = [{ value: (ours.ci95[1] - ours.ci95[0]) / 2, causes: ['uncertainty-kind'], basis: 'the half-width of the 95 % confidence interval', detail: '95 % confidence half-width' }];
    const weightedFit = refit.weightedFit;
    const otherConvention = weightedFit?.otherConvention[c.name];
    if (weightedFit && otherConvention !== undefined && settings.weightedErrors !== 'either') {
      const says = weightedFit.convention === 'absolute' ? 'scaled by the scatter about the line' : 'with the SEs of k_obs taken as absolute';
      spread.push({ value: otherConvention, causes: ['uncertainty-kind'], basis: `the standard error ${says}`, detail: `standard error ${says}` });
    }
    checkValue(
      {
        what: `The standard error of ${c.label}`,
        path: `${path}.uncertainty`,
        stage: 'rate-law',
        rubricItem: uncertaintyItem,
        itemKey: uncertaintyItem,
        charge: rubric[uncertaintyItem],
        reported: read.uncertainty,
        unit,
        expected: ours.standardError,
        alsoRight: settings.weightedErrors === 'either' && otherConvention !== undefined ? [otherConvention] : [],
        carriedForward: theirs && { value: theirs.standardError, from, quiet: outcome.kind === 'carried-forward' },
        slips: () => spread,
        factors: factors.filter((f) => f !== SIGN),
        causes: firstOrderCauses,
        tolerance: tolerances.rateLawUncertainty,
        causeTolerance: () => slipMatch(reported.uncertainty!, read.uncertainty!, tolerances.rateLawUncertainty),
        rounding: roundingOfUncertainty(reported.uncertainty!),
      },
      drafts,
    );
  }
  // A value already found wrong needs no second warning about its size.
  if (outcome.kind === 'right' || outcome.kind === 'carried-forward') checkPlausible(c, read.value, read.uncertainty, settings, drafts);
}

/** Outside the instructor's reference band, or k_N below zero by more than its 95 % interval. */
function checkPlausible(c: Constant, value: number, uncertainty: number | undefined, settings: Settings, drafts: DraftFinding[]): void {
  const band = settings.reference?.[c.name];
  const path = `reported.${c.name}`;
  const unit = settings.units[c.name];
  const warn = (message: string) => drafts.push({ code: 'implausible', path, stage: 'rate-law', severity: 'warning', charge: 0, reported: value, unit, message });
  const outside = band && outsideBand(band, value, unit, { label: c.label, path, stage: 'rate-law', advice: 'This may be right for your data, but it is worth checking the runs and the units.' });
  if (outside) {
    drafts.push(outside);
    return;
  }
  // 1.96: the two-sided 95 % normal quantile; the degrees of freedom behind a reported value are unknown.
  if (c.name === 'kN' && uncertainty !== undefined && value + 1.96 * uncertainty < 0) {
    warn(`k_N = ${fmt(value)} ± ${fmt(uncertainty)} ${unit} is below zero by more than its uncertainty allows; a rate constant cannot be negative. Check the runs at low catalyst concentration and the fit.`);
  }
}

export function checkRateLaw(submission: Submission, refit: RateLawRefit | undefined, settings: Settings, drafts: DraftFinding[]): void {
  if (!refit) return;
  if (refit.unweightedBecause) {
    noteRefit(drafts, `The assignment asks for a weighted fit of k_obs against the catalyst concentration, but ${refit.unweightedBecause}. k_N and k_A were checked against the ordinary (unweighted) fit instead.`);
  }
  if (refit.weightedFit) noteConvention(refit, settings, drafts);
  for (const c of CONSTANTS) checkConstant(c, submission.reported?.[c.name], refit, settings, drafts);
}

/**
 * Where the two conventions for a weighted fit's standard errors disagree by more than the
 * tolerance, the refit says which it used and by how much the k_obs scatter beyond their SEs.
 */
function noteConvention(refit: RateLawRefit, settings: Settings, drafts: DraftFinding[]): void {
  const w = refit.weightedFit!;
  const ratio = Math.sqrt(w.reducedChiSquared);
  if (withinTolerance(w.otherConvention.kA, refit.kA.standardError, settings.tolerances.rateLawUncertainty)) return;
  const ses = (kN: number, kA: number) => `SE(k_N) = ${withUnit(kN, settings.units.kN)}, SE(k_A) = ${withUnit(kA, settings.units.kA)}`;
  const absolute = w.convention === 'absolute' ? ses(refit.kN.standardError, refit.kA.standardError) : ses(w.otherConvention.kN, w.otherConvention.kA);
  const scaled = w.convention === 'scaled' ? ses(refit.kN.standardError, refit.kA.standardError) : ses(w.otherConvention.kN, w.otherConvention.kA);
  const accepted =
    settings.weightedErrors === 'either'
      ? 'Either convention is accepted.'
      : `The assignment asks for the ${settings.weightedErrors === 'absolute' ? 'first' : 'second'}; the standard errors are checked against it.`;
  noteRefit(
    drafts,
    `The weighted fit of k_obs against the catalyst concentration has a reduced chi-square of ${fmt(w.reducedChiSquared)}: the k_obs scatter about the line ` +
      `${ratio > 1 ? 'more' : 'less'} than their standard errors imply, so the standard errors of k_N and k_A depend on the convention. ` +
      `With each SE of k_obs taken as absolute: ${absolute}. Scaled by the scatter about the line (times ${fmt(ratio)}): ${scaled}. ${accepted}`,
  );
}

/** An information note on the rate law's refit: no points, for the TA to see why it was done so. */
function noteRefit(drafts: DraftFinding[], message: string): void {
  drafts.push({ code: 'refit-note', path: 'reported', stage: 'rate-law', severity: 'info', charge: 0, message });
}
