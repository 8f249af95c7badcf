import type { Settings, SubmittedRun } from '../schemas.ts';
import type { Estimate } from '../../../server/engine/estimate.ts';
import { firstOrderCauses } from './causes.ts';
import { rateUnitOf } from '../../../server/engine/units.ts';
import type { NumberLike } from '../../../schemas/common.ts';
import { closeMatch, slipMatch } from '../../../server/checks/cause-tolerance.ts';
import { roundingOf, roundingOfUncertainty } from '../../../server/checks/rounding-rule.ts';
import { lastPlace } from '../../../server/checks/written-number.ts';
import { checkValue, type ValueOutcome } from '../../../server/checks/check-value.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { DECIMAL_SHIFT, LOG_BASE, RATE_CONSTANT_FACTORS, TIME_UNIT, type Candidate, type Expanded, type Factor } from '../../../server/checks/explain.ts';
import { readReported } from '../../../server/checks/reported-number.ts';
import type { LnFColumn } from './check-lnf-column.ts';
import { withinTolerance } from '../../../server/checks/tolerance.ts';
import { guggenheimFits } from './guggenheim-fits.ts';
import type { RunAnalysis } from './run-analysis.ts';
import { fitDefined, infinitySlipFits, methodSlipFits, WRONG_INFINITY, type SlipFit } from './slip-values.ts';

/** The student's k for one run, in the run's rate unit, as the second stage will use it. */
export interface StudentK {
  value: number;
  uncertainty?: number;
}

function missing(path: string, what: string, item: string, itemKey: string, charge: number, drafts: DraftFinding[]): void {
  if (charge > 0) {
    drafts.push({ code: 'missing-value', path, stage: 'run', rubricItem: item, itemKey, severity: 'error', charge, message: `${what} is missing.` });
  }
}

/** Checks a run's reported k and its uncertainty; returns the k as the student has it. */
export function checkRunK(
  run: SubmittedRun,
  a: RunAnalysis,
  all: RunAnalysis[],
  ownColumn: LnFColumn | undefined,
  settings: Settings,
  drafts: DraftFinding[],
): StudentK | undefined {
  const path = `${a.path}.reported.k`;
  const what = `k_obs of run "${a.label}"`;
  const reported = run.reported?.k;
  const { rubric, tolerances } = settings;
  // No rate constant to mark against (a finding on the run says why): k and its uncertainty are not graded.
  if (a.undetermined) return undefined;
  if (!reported) {
    // An absent value has no standard error either: both rubric items are unearned.
    missing(path, what, 'k', `k@${a.path}`, rubric.k, drafts);
    missing(`${path}.uncertainty`, `The standard error of ${what}`, 'kUncertainty', `kUncertainty@${a.path}`, rubric.kUncertainty, drafts);
    return undefined;
  }
  const unit = rateUnitOf(a.timeUnit);
  const read = readReported(reported, 'first-order-rate', unit, settings.units.k, { path, what, stage: 'run' }, drafts);
  // The values of known slips are needed only for a value that is not right: most are right. Those
  // with another x_inf take dozens of refits and are made only when no commoner slip explains k.
  let method: SlipFit[] | undefined;
  let infinity: SlipFit[] | undefined;
  const slipValues: SlipValues = {
    method: () => (method ??= methodSlipFits(a, settings.fitModel)),
    infinity: () => (infinity ??= infinitySlipFits(a, all, settings.fitModel)),
  };
  // k from the student's own ln F column, when that column carries a slip of its own.
  let own: Estimate | undefined;
  // A column of another length was named as such; k is then judged against the refit alone.
  if (ownColumn?.wrong && a.transform && ownColumn.values.length === a.transform.t.length) {
    const fit = fitDefined(settings.fitModel, a.transform.t, ownColumn.values);
    own = { value: -fit.slope, standardError: fit.seSlope, ci95: [0, 0], unit };
  }
  const columnRight = ownColumn !== undefined && !ownColumn.wrong;
  const outcome = checkValue(
    {
      what,
      path,
      stage: 'run',
      rubricItem: 'k',
      itemKey: `k@${a.path}`,
      charge: rubric.k,
      reported: read.value,
      unit,
      expected: a.expected.value,
      alsoRight: a.alsoRight.map((e) => e.value),
      // Without x_inf the readings fix k only within our fit's 95 % interval: a method of the trade
      // (Guggenheim at another interval, Kezdy-Swinbourne) that lands inside it is right too.
      rightWithin: a.infinity === undefined ? a.expected.ci95 : undefined,
      carriedForward: own && { value: own.value, from: 'your own ln F column' },
      slips: () => slipValues.method().map((s) => s.k),
      // The student's own ln F column, where it is right, shows the x_inf they used.
      laterSlips: columnRight ? undefined : { cause: WRONG_INFINITY, bases: () => slipValues.infinity().map((s) => s.k) },
      factors: RATE_CONSTANT_FACTORS,
      causes: firstOrderCauses,
      tolerance: tolerances.k,
      closeTolerance: () => closeMatch(reported.value, read.value, tolerances.k),
      rounding: roundingOf(reported.value, read.uncertainty, a.expected.standardError, rubric.sigFigs),
    },
    drafts,
  );
  const candidates = () => uncertaintySlips(read.value, Number(reported.value), a, slipValues.method().map((s) => s.se));
  const written = reported.uncertainty;
  const uncertainty = read.uncertainty === undefined || written === undefined ? undefined : { value: read.uncertainty, written };
  // The SE of an accepted method's own fit, where k is that fit's to the digits written (as a long shot must be).
  // Fitted only for an SE to judge: a run without x_inf is refitted at every interval.
  const kMatch = uncertainty && closeMatch(reported.value, read.value, tolerances.k);
  const methodSEs = kMatch
    ? guggenheimFits(a)
        .filter((fit) => withinTolerance(read.value, fit.value, kMatch))
        .map((fit) => fit.standardError)
    : [];
  checkUncertainty(uncertainty, a, own, outcome, { values: slipValues, candidates }, methodSEs, settings, drafts);
  return { value: read.value, uncertainty: read.uncertainty };
}

/**
 * A slip of method changes k as well as its standard error, so its SE explains a reported SE only
 * when k shows the same slip (that SE then counts as right, beside its k); otherwise the match is
 * chance. The fit-model slip is the exception where the two models' k agree: with 16 readings from
 * t = 0 the intercept model's SE is about 1.9 times the origin model's, close to a 95 % half-width
 * (2.13 SE), so the value decides between the two where it can, and where the two models' k agree
 * to the digits reported, the closer of the two candidates is named.
 */
function uncertaintySlips(value: number, written: number, a: RunAnalysis, slipSEs: Candidate[]): Candidate[] {
  if (!a.other) return [];
  const model = slipSEs.filter((se) => se.causes.includes('fit-model'));
  const toAsked = Math.abs(value - a.expected.value);
  const toOther = Math.abs(value - a.other.k.value);
  if (Math.abs(toAsked - toOther) > lastPlace(written, value) / 2) return toOther < toAsked ? model : [];
  return model.map((se) => ({ ...se, closestWins: true }));
}

/** The slips' values, by the cost of making them. */
interface SlipValues {
  method: () => SlipFit[];
  infinity: () => SlipFit[];
}

/** The SE of the slip that explains k, where a slip of method or x_inf does: right beside its k. */
function sameSlipSE(by: Expanded, values: SlipValues): Candidate | undefined {
  const same = (s: SlipFit) => s.se.causes.every((c) => by.causes.includes(c)) && s.se.detail === by.detail;
  return (values.method().find(same) ?? (by.causes.includes(WRONG_INFINITY) ? values.infinity().find(same) : undefined))?.se;
}

/**
 * Scalings of an SE alone: a misplaced decimal point is a copying slip of its own; a scaling of the
 * whole fit (logarithm base, time unit) reaches the SE only together with k, so it is tried only
 * where k shows it.
 */
function uncertaintyFactors(kOutcome: ValueOutcome): Factor[] {
  const withK = kOutcome.kind === 'explained' ? [LOG_BASE, ...TIME_UNIT].filter((f) => kOutcome.by.causes.includes(f.cause)) : [];
  return [...withK, ...DECIMAL_SHIFT];
}

/**
 * The line through the origin is fitted to every (t, ln F) point, (0, 0) among them, with n - 1
 * degrees of freedom, as common spreadsheet functions do (LINEST with the constant set to zero);
 * counting the fixed point out leaves n - 2, and an SE larger by sqrt((n - 1)/(n - 2)). Both are in
 * use, and both are right.
 */
function otherDegreesOfFreedom(a: RunAnalysis): number[] {
  const line = a.asked?.line;
  if (!line || line.model !== 'origin' || line.dof < 2) return [];
  return [a.expected.standardError * Math.sqrt(line.dof / (line.dof - 1))];
}

/** The standard error of the fit the student's k came from, against the measures of spread often reported instead. */
function checkUncertainty(
  reported: { value: number; written: NumberLike } | undefined,
  a: RunAnalysis,
  own: Estimate | undefined,
  kOutcome: ValueOutcome,
  /** Every slip's SE, and those that may explain this SE on their own. */
  slips: { values: SlipValues; candidates: () => Candidate[] },
  /** The SEs of accepted methods' fits that give the student's k. */
  methodSEs: number[],
  settings: Settings,
  drafts: DraftFinding[],
): void {
  const path = `${a.path}.reported.k.uncertainty`;
  const what = `The standard error of k_obs of run "${a.label}"`;
  const charge = settings.rubric.kUncertainty;
  if (reported === undefined) {
    missing(path, what, 'kUncertainty', `kUncertainty@${a.path}`, charge, drafts);
    return;
  }
  // Judge the uncertainty against the fit the value came from, so one slip is not named twice.
  const by = kOutcome.kind === 'explained' ? kOutcome.by : undefined;
  const byK = by && sameSlipSE(by, slips.values);
  const expected = a.expected.standardError;
  const line = a.asked;
  const spread = (): Candidate[] =>
    line
      ? [
          { value: line.line.residualSD, causes: ['uncertainty-kind'], basis: 'the standard deviation of the ln F points about the line', detail: 'standard deviation of the points' },
          { value: (line.k.ci95[1] - line.k.ci95[0]) / 2, causes: ['uncertainty-kind'], basis: 'the half-width of the 95 % confidence interval', detail: '95 % confidence half-width' },
        ]
      : [];
  checkValue(
    {
      what,
      path,
      stage: 'run',
      rubricItem: 'kUncertainty',
      itemKey: `kUncertainty@${a.path}`,
      charge,
      reported: reported.value,
      unit: rateUnitOf(a.timeUnit),
      expected,
      alsoRight: [...otherDegreesOfFreedom(a), ...methodSEs, ...(byK ? [byK.value] : [])],
      carriedForward: own && { value: own.standardError, from: 'your own ln F column', quiet: kOutcome.kind === 'carried-forward' },
      slips: () => [...spread(), ...slips.candidates()],
      factors: uncertaintyFactors(kOutcome),
      causes: firstOrderCauses,
      tolerance: settings.tolerances.kUncertainty,
      causeTolerance: () => slipMatch(reported.written, reported.value, settings.tolerances.kUncertainty),
      rounding: roundingOfUncertainty(reported.written),
    },
    drafts,
  );
}
