import type { ReportedValue } from '../../../schemas/common.ts';
import type { Settings, Submission } from '../schemas.ts';
import type { CheckResult, RubricCount } from '../../../schemas/result.ts';
import { GAS_CONSTANT } from '../../../server/engine/physical-constants.ts';
import { convert, type UnitKind } from '../../../server/engine/units.ts';
import { slipMatch } from '../../../server/checks/cause-tolerance.ts';
import { checkRounding } from '../../../server/checks/sig-figs.ts';
import { checkValue } from '../../../server/checks/check-value.ts';
import { roundingOf, roundingOfUncertainty } from '../../../server/checks/rounding-rule.ts';
import { outsideBand } from '../../../server/checks/reference-band.ts';
import { scoreFindings, type DraftFinding } from '../../../server/checks/draft-finding.ts';
import { scoredResult } from '../../../server/checks/scored-result.ts';
import { DECIMAL_SHIFT, LOG_BASE, SIGN, TIME_UNIT, type Candidate, type Factor } from '../../../server/checks/explain.ts';
import { readReported } from '../../../server/checks/reported-number.ts';
import { caloriesWrongWay } from './calories-wrong-way.ts';
import { causesOf, temperatureCauses } from './causes.ts';
import { checkRunKs } from './check-run-k.ts';
import { activationOf, type Activation, type TemperatureAnalysis } from './refit.ts';
import { hasTwoPoints, twoPointsNote } from './two-points.ts';
import { analyseAsMeant } from './time-unit-plausibility.ts';
import { theirUnfittedPoints } from './unfitted-points.ts';

type Quantity = Exclude<keyof Activation, 'EaSE'>;

const QUANTITIES: Record<Quantity, { label: string; stage: string; unitKind: UnitKind; base: string }> = {
  Ea: { label: 'E_a', stage: 'arrhenius', unitKind: 'molar-energy', base: 'J mol^-1' },
  A: { label: 'A', stage: 'arrhenius', unitKind: 'first-order-rate', base: 's^-1' },
  dH: { label: 'ΔH‡', stage: 'eyring', unitKind: 'molar-energy', base: 'J mol^-1' },
  dS: { label: 'ΔS‡', stage: 'eyring', unitKind: 'molar-entropy', base: 'J K^-1 mol^-1' },
};

// R in other units, read as if in J K^-1 mol^-1: 1.987 cal K^-1 mol^-1 and 0.08206 L atm K^-1 mol^-1
// (common practice, no source).
const GAS_CONSTANT_SLIPS: Factor[] = [
  { factor: 1.987 / GAS_CONSTANT, cause: 'gas-constant', says: 'times 1.987/8.314 (R in cal K^-1 mol^-1)' },
  { factor: 0.08206 / GAS_CONSTANT, cause: 'gas-constant', says: 'times 0.08206/8.314 (R in L atm K^-1 mol^-1)' },
];
// 1000 J per kJ (the prefix) and 4.184 J per thermochemical calorie (its definition). Dividing by
// 4.184 is the same number as R in calories (1.987/8.314), which that cause names; dividing by 1000
// on E_a or ΔH‡ the same as 1000/T read as 1/T: their words say so.
const ENERGY_UNIT: Factor[] = [
  { factor: 1000, cause: 'energy-unit', says: 'multiplied by 1000 (joules written as kilojoules)' },
  { factor: 1 / 1000, cause: 'energy-unit', says: 'divided by 1000 (kilojoules written as joules)' },
  { factor: 4.184, cause: 'energy-unit', says: 'multiplied by 4.184 (joules converted to calories the wrong way)' },
];

const FACTORS: Record<Quantity, Factor[]> = {
  Ea: [SIGN, LOG_BASE, ...GAS_CONSTANT_SLIPS, ...ENERGY_UNIT, ...DECIMAL_SHIFT],
  A: [...TIME_UNIT, ...DECIMAL_SHIFT],
  dH: [SIGN, LOG_BASE, ...GAS_CONSTANT_SLIPS, ...ENERGY_UNIT, ...DECIMAL_SHIFT],
  dS: [SIGN, ...GAS_CONSTANT_SLIPS, ...ENERGY_UNIT, ...DECIMAL_SHIFT],
};

/** What the slips of method give for one quantity (or the SE of E_a), in the instructor's unit. */
function slipCandidates(analysis: TemperatureAnalysis, q: keyof Activation, unit: string): Candidate[] {
  return Object.entries(analysis.slips).flatMap(([code, variants]) =>
    (variants ?? []).flatMap(({ values, detail }) =>
      // Computed exactly from the data, a slip's value beats a scaling that only lands within tolerance
      // (an absolute tolerance on a ΔS‡ near zero lets many scalings land there).
      values[q] === undefined ? [] : [{ value: convert(values[q]!, QUANTITIES[q === 'EaSE' ? 'Ea' : q].base, unit), causes: [code], basis: `the value with ${detail}`, detail, closestWins: true }],
    ),
  );
}

/** What follows from the student's own rate constants, where they differ from ours (a run's k misread). */
const FROM_THEIR_K = 'your own rate constants from the runs';

function checkQuantity(q: Quantity, reported: ReportedValue | undefined, analysis: TemperatureAnalysis, theirs: Activation | undefined, settings: Settings, drafts: DraftFinding[], seDefined: boolean): void {
  const { label, stage, unitKind } = QUANTITIES[q];
  const path = `reported.${q}`;
  const charge = settings.rubric[q];
  const asksSE = q === 'Ea' && settings.rubric.EaUncertainty > 0 && seDefined;
  const missingSE = () => drafts.push({ code: 'missing-value', path: `${path}.uncertainty`, stage, rubricItem: 'EaUncertainty', itemKey: 'EaUncertainty', severity: 'error', charge: settings.rubric.EaUncertainty, message: `The standard error of ${label} is missing.` });
  if (!reported) {
    if (charge > 0) drafts.push({ code: 'missing-value', path, stage, rubricItem: q, itemKey: q, severity: 'error', charge, message: `${label} is missing.` });
    // An absent value has no standard error either: both rubric items are unearned.
    if (asksSE) missingSE();
    return;
  }
  const unit = settings.units[q];
  const read = readReported(reported, unitKind, unit, unit, { path, what: label, stage }, drafts);
  const ours = analysis[q];
  const outcome = checkValue(
    { what: label, path, stage, rubricItem: q, itemKey: q, charge, reported: read.value, unit, expected: ours.value, carriedForward: theirs && { value: convert(theirs[q], QUANTITIES[q].base, unit), from: FROM_THEIR_K }, slips: () => slipCandidates(analysis, q, unit), factors: [...FACTORS[q], ...caloriesWrongWay(reported.unit)], causes: causesOf(q), tolerance: settings.tolerances[q], causeTolerance: () => slipMatch(reported.value, read.value, settings.tolerances[q]), rounding: roundingOf(reported.value, read.uncertainty, ours.standardError, settings.rubric.sigFigs) },
    drafts,
  );
  // A value already found wrong needs no second warning about its size.
  const band = settings.reference?.[q];
  if (band && (outcome.kind === 'right' || outcome.kind === 'carried-forward')) {
    const outside = outsideBand(band, read.value, unit, { label, path, stage, advice: 'It agrees with the refit of your data, so this may be right; it is worth checking the temperatures and the rate constants.' });
    if (outside) drafts.push(outside);
  }
  if (!asksSE) return;
  if (read.uncertainty === undefined) {
    missingSE();
    return;
  }
  checkValue(
    {
      what: `The standard error of ${label}`,
      path: `${path}.uncertainty`,
      stage,
      rubricItem: 'EaUncertainty',
      itemKey: 'EaUncertainty',
      charge: settings.rubric.EaUncertainty,
      reported: read.uncertainty,
      unit,
      expected: ours.standardError,
      alsoRight: scaledConvention(analysis).map((factor) => factor * ours.standardError),
      carriedForward: theirs && { value: convert(theirs.EaSE, QUANTITIES.Ea.base, unit), from: FROM_THEIR_K, quiet: outcome.kind === 'carried-forward' },
      slips: () => slipCandidates(analysis, 'EaSE', unit),
      factors: [...FACTORS.Ea.filter((f) => f !== SIGN), ...caloriesWrongWay(reported.unit)],
      causes: temperatureCauses,
      tolerance: settings.tolerances.uncertainty,
      causeTolerance: () => slipMatch(reported.uncertainty!, read.uncertainty!, settings.tolerances.uncertainty),
      rounding: roundingOfUncertainty(reported.uncertainty!),
    },
    drafts,
  );
}

/**
 * A weighted fit's standard errors come in two conventions in use: each SE of k taken as absolute (our
 * refit's), or scaled by the scatter about the line (times the square root of the reduced chi-square).
 * Both are right; this is the factor from the one to the other.
 */
function scaledConvention(analysis: TemperatureAnalysis): number[] {
  return analysis.reducedChiSquared === undefined ? [] : [Math.sqrt(analysis.reducedChiSquared)];
}

/**
 * What each rubric item is worth for this submission (k once per point given as a run that could be
 * fitted); an item worth nothing is left out.
 */
export function rubricCounts(settings: Settings, submission: Pick<Submission, 'points'>, unfittedRuns = 0): RubricCount[] {
  const runs = submission.points.filter((p) => p.run).length - unfittedRuns;
  return Object.entries(settings.rubric).flatMap(([item, each]) => {
    // With two temperatures the standard error of E_a is not defined: nothing to grade.
    const count = item === 'k' ? runs : item === 'EaUncertainty' && hasTwoPoints(submission.points.length - unfittedRuns) ? 0 : 1;
    return each > 0 && count > 0 ? [{ item, count, each }] : [];
  });
}

export function checkTemperatureDependence(settings: Settings, submitted: Submission): Omit<CheckResult, 'engineVersion'> {
  // Runs whose times cannot be in their declared unit are checked in the unit meant, as a TA reads them.
  const { submission, analysis, drafts: timeUnitDrafts } = analyseAsMeant(settings, submitted);
  const drafts: DraftFinding[] = [...analysis.dataNotes, ...timeUnitDrafts];
  const theirK = checkRunKs(submission, analysis, settings, drafts);
  // Their fits, where a run's k as they have it differs from ours or a run we could not fit has a k
  // of theirs: what their E_a and the rest follow from.
  const position = new Map(analysis.pointIndex.map((at, j) => [at, j]));
  const differs = [...theirK].some(([i, k]) => Math.abs(k - analysis.points[position.get(i)!].k) > 1e-9 * analysis.points[position.get(i)!].k);
  const ownUnfitted = theirUnfittedPoints(submission, analysis);
  const ownPoints = [...analysis.points.map((p, j) => ({ ...p, k: theirK.get(analysis.pointIndex[j]) ?? p.k })), ...ownUnfitted];
  const theirs = differs || ownUnfitted.length > 0 ? activationOf(ownPoints, settings.fit === 'weighted') : undefined;
  const twoPoints = hasTwoPoints(analysis.points.length);
  if (twoPoints) drafts.push(twoPointsNote(submission));
  for (const q of Object.keys(QUANTITIES) as Quantity[]) checkQuantity(q, submission.reported?.[q], analysis, theirs, settings, drafts, !twoPoints);
  checkRounding(
    [
      ...analysis.runs.map((r): [string, ReportedValue | undefined] => [`points[${r.index}].run.reported.k`, submission.points[r.index].run?.reported?.k]),
      ...(Object.keys(QUANTITIES) as Quantity[]).map((q): [string, ReportedValue | undefined] => [`reported.${q}`, submission.reported?.[q]]),
    ],
    settings.rubric.sigFigs,
    drafts,
  );
  const findings = scoreFindings(drafts, temperatureCauses.systematic);
  const refit = {
    Ea: analysis.Ea,
    A: analysis.A,
    dH: analysis.dH,
    dS: analysis.dS,
    points: analysis.points.map((p, i) => ({ label: analysis.labels[i], temperatureK: p.temperature, kPerSecond: p.k })),
  };
  return scoredResult(submission.studentId, rubricCounts(settings, submission, analysis.unfitted.length), findings, refit, []);
}
