import type { NumberLike, ReportedValue, Tolerance } from '../../../schemas/common.ts';
import { lastPlace } from '../../../server/checks/written-number.ts';
import type { Equilibrium, EquilibriumRefit, RunEquilibrium, Settings, Submission } from '../schemas.ts';
import { checkValue, type ValueOutcome } from '../../../server/checks/check-value.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { DECIMAL_SHIFT, type Candidate, type Factor } from '../../../server/checks/explain.ts';
import { fmt } from '../../../server/checks/format.ts';
import { readableIn, readReported } from '../../../server/checks/reported-number.ts';
import { convert, rateUnitOf } from '../../../server/engine/units.ts';
import { constantOf, fractionB, fractionOf, inDm } from '../equilibrium.ts';
import { firstOrderCauses } from './causes.ts';
import type { StudentK } from './check-run-k.ts';
import { concentrationOf, pureFormsOf } from './equilibrium-refit.ts';
import { isFitted, type RunOutcome } from './run-analysis.ts';

/** What of the block can be graded for this submission: the maximum holds these items. */
export interface EquilibriumItems {
  /** Runs with a K of ours: their composition and K. */
  runsWithK: number;
  /** Of those, runs with a k_obs of ours to split. */
  runsWithSplit: number;
  meanK: boolean;
  rateLawSplit: boolean;
}

// A percentage declared where a fraction is meant, or the reverse: 100 between them by definition.
const PERCENT: Factor[] = [
  { factor: 100, cause: 'percent-fraction', says: 'multiplied by 100 (a percentage written where a fraction is declared)' },
  { factor: 0.01, cause: 'percent-fraction', says: 'divided by 100 (a fraction written where a percentage is declared)' },
];
const FRACTION_UNITS = ['', '1', 'fraction'];
const PERCENT_UNITS = ['%', 'percent'];

const STAGE = 'equilibrium';

/** The student's numbers for one run, where given and readable, on which their later values rest. */
interface Theirs {
  rotation?: number;
  xB?: number;
  K?: number;
}

/** A fraction as written: `%` declares a percentage; any other unit but none, 1 or `fraction` is a finding, read as a fraction. */
function readFraction(reported: ReportedValue, path: string, what: string, drafts: DraftFinding[]): number {
  const unit = reported.unit.trim().toLowerCase();
  if (PERCENT_UNITS.includes(unit)) return Number(reported.value) / 100;
  if (!FRACTION_UNITS.includes(unit)) {
    drafts.push({ code: 'unit-unrecognised', path, stage: 'reporting', severity: 'warning', charge: 0, message: `The unit "${reported.unit}" given for ${what} is not recognised; the value was read as a fraction. Write % for a percentage, or no unit for a fraction.` });
  }
  return Number(reported.value);
}

// A slip is named for x_B only where it gives the value to 1 % or half its last written place: the band
// for right (0.005 as a fraction) would let a near-zero x_B match a percentage slip by chance.
const FRACTION_MATCH = 0.01;
const fractionMatch = (written: NumberLike, value: number): Tolerance => ({ absolute: Math.max(FRACTION_MATCH * Math.abs(value), 0.5 * lastPlace(written, value)) });

const finite = (v: number | undefined): number | undefined => (v !== undefined && Number.isFinite(v) ? v : undefined);

class EquilibriumChecker {
  constructor(
    private readonly block: Equilibrium,
    private readonly settings: Settings,
    private readonly drafts: DraftFinding[],
  ) {}

  private missing(path: string, what: string, item: string, itemKey: string, charge: number): void {
    if (charge > 0) this.drafts.push({ code: 'missing-value', path, stage: STAGE, rubricItem: item, itemKey, severity: 'error', charge, message: `${what} is missing.` });
  }

  private value(c: { what: string; path: string; item: string; itemKey: string; charge: number; reported: number; unit: string; expected: number; carried?: { value: number | undefined; from: string }; slips: Candidate[]; factors?: Factor[]; tolerance: Tolerance; causeTolerance?: () => Tolerance }): ValueOutcome {
    const carried = finite(c.carried?.value);
    return checkValue(
      {
        what: c.what,
        path: c.path,
        stage: STAGE,
        rubricItem: c.item,
        itemKey: c.itemKey,
        charge: c.charge,
        reported: c.reported,
        unit: c.unit,
        expected: c.expected,
        carriedForward: carried === undefined ? undefined : { value: carried, from: c.carried!.from },
        slips: () => c.slips.filter((s) => Number.isFinite(s.value)),
        factors: c.factors ?? [],
        causes: firstOrderCauses,
        tolerance: c.tolerance,
        causeTolerance: c.causeTolerance,
      },
      this.drafts,
    );
  }

  /** [α]_eq, x_B, K, k_f and k_r of one run; returns the student's K where they gave one (or x_B to make it). */
  run(a: RunOutcome, ours: RunEquilibrium, reported: NonNullable<Submission['runs'][number]['reported']> | undefined, theirK: StudentK | undefined): number | undefined {
    const { rubric, tolerances } = this.block;
    const runPath = a.path;
    const label = `run "${a.label}"`;
    const pure = pureFormsOf(this.block);
    const lc = inDm(this.block.pathLength) * concentrationOf(this.block, a.label);
    const composition = { item: 'composition', itemKey: `composition@${runPath}`, charge: rubric.composition };
    const theirs: Theirs = {};
    // The slips that change [α]_eq, as specific rotations.
    const rotationSlips: Candidate[] = [
      { value: ours.specificRotation.value / 10, causes: ['path-length-unit'], basis: '[α]_eq with l in cm' },
      { value: ours.specificRotation.value / 100, causes: ['mass-concentration-unit'], basis: '[α]_eq with c in g/100 mL taken as g/mL' },
      ...(isFitted(a) ? [{ value: a.readings[0] / lc, causes: ['start-for-end-value'], basis: '[α] from the first reading α_0' }] : []),
    ];
    const asFraction = (c: Candidate): Candidate => ({ ...c, value: fractionB(c.value, pure), basis: `x_B from ${c.basis}` });
    const asConstant = (c: Candidate): Candidate => ({ ...c, value: constantOf(c.value), basis: c.basis.replace(/^x_B/, 'K') });

    if (reported?.specificRotation) {
      const path = `${runPath}.reported.specificRotation`;
      theirs.rotation = finite(Number(reported.specificRotation.value));
      this.value({ ...composition, what: `[α]_eq of ${label}`, path, reported: Number(reported.specificRotation.value), unit: ours.specificRotation.unit, expected: ours.specificRotation.value, slips: rotationSlips, tolerance: tolerances.specificRotation });
    }
    const xSlips = (theirs.rotation === undefined ? rotationSlips.map(asFraction) : []).concat([{ value: 1 - ours.xB.value, causes: ['anomers-swapped'], basis: 'x_A, the other anomer’s fraction' }]);
    const xPath = `${runPath}.reported.xB`;
    if (!reported?.xB) {
      this.missing(xPath, `x_B of ${label}`, composition.item, composition.itemKey, composition.charge);
    } else {
      const own = theirs.rotation === undefined ? undefined : fractionB(theirs.rotation, pure);
      const x = readFraction(reported.xB, xPath, `x_B of ${label}`, this.drafts);
      theirs.xB = finite(x);
      if (own !== undefined) xSlips.push({ value: 1 - own, causes: ['anomers-swapped'], basis: 'x_A from your own [α]_eq' });
      this.value({ ...composition, what: `x_B of ${label}`, path: xPath, reported: x, unit: '', expected: ours.xB.value, carried: { value: own, from: 'your own [α]_eq' }, slips: xSlips, factors: PERCENT, tolerance: tolerances.xB, causeTolerance: () => fractionMatch(reported.xB!.value, x) });
    }
    const K = ours.K!;
    const kPath = `${runPath}.reported.K`;
    const constant = { item: 'constant', itemKey: `constant@${runPath}`, charge: rubric.constant };
    if (!reported?.K) {
      this.missing(kPath, `K of ${label}`, constant.item, constant.itemKey, constant.charge);
    } else {
      const own = theirs.xB === undefined ? undefined : constantOf(theirs.xB);
      const slips: Candidate[] = [
        { value: 1 / K.value, causes: ['inverted-constant'], basis: 'x_A/x_B' },
        ...(own !== undefined ? [{ value: 1 / own, causes: ['inverted-constant'], basis: 'the inverse of K from your own x_B' }] : xSlips.map(asConstant)),
      ];
      theirs.K = finite(Number(reported.K.value));
      this.value({ ...constant, what: `K of ${label}`, path: kPath, reported: Number(reported.K.value), unit: '', expected: K.value, carried: { value: own, from: 'your own x_B' }, slips, tolerance: tolerances.K });
    }
    if (ours.kf && ours.kr) this.split(a, ours, reported, theirK, theirs);
    return theirs.K ?? (theirs.xB === undefined ? undefined : finite(constantOf(theirs.xB)));
  }

  /** k_f and k_r of one run: one rubric item together, since one slip usually moves both. */
  private split(a: RunOutcome, ours: RunEquilibrium, reported: NonNullable<Submission['runs'][number]['reported']> | undefined, theirK: StudentK | undefined, theirs: Theirs): void {
    const unit = this.settings.units.k;
    // Without a k_obs of theirs (or a K or x_B), nothing follows from their own numbers.
    const k = theirK === undefined ? Number.NaN : convert(theirK.value, rateUnitOf(a.timeUnit), unit);
    const x = theirs.K !== undefined ? fractionOf(theirs.K) : (theirs.xB ?? Number.NaN);
    const item = { item: 'kSplit', itemKey: `kSplit@${a.path}`, charge: this.block.rubric.kSplit };
    const sides = [
      { name: 'kf', label: 'k_f', ours: ours.kf!.value, other: ours.kr!.value, own: finite(k * x), ownOther: finite(k * (1 - x)) },
      { name: 'kr', label: 'k_r', ours: ours.kr!.value, other: ours.kf!.value, own: finite(k * (1 - x)), ownOther: finite(k * x) },
    ] as const;
    for (const side of sides) {
      const path = `${a.path}.reported.${side.name}`;
      const what = `${side.label} of run "${a.label}"`;
      const value = reported?.[side.name];
      if (!value) {
        this.missing(path, what, item.item, item.itemKey, item.charge);
        continue;
      }
      const read = readReported(value, 'first-order-rate', unit, unit, { path, what, stage: STAGE }, this.drafts);
      const swapped = 'the other rate constant';
      const slips: Candidate[] = [{ value: side.other, causes: ['rate-constants-swapped'], basis: swapped }];
      if (side.ownOther !== undefined) slips.push({ value: side.ownOther, causes: ['rate-constants-swapped'], basis: `${swapped} from your own k_obs and K` });
      this.value({ ...item, what, path, reported: read.value, unit, expected: side.ours, carried: { value: side.own, from: 'your own k_obs and K' }, slips, factors: DECIMAL_SHIFT, tolerance: this.block.tolerances.kSplit });
    }
  }

  /** The mean K; returns the student's where given, else the mean of their runs' K. */
  meanK(ours: NonNullable<EquilibriumRefit['meanK']>, reported: ReportedValue | undefined, theirRuns: Array<number | undefined>): number | undefined {
    const path = 'reported.K';
    const item = { item: 'meanK', itemKey: 'meanK', charge: this.block.rubric.meanK };
    const own = theirRuns.length > 0 && theirRuns.every((v) => v !== undefined) ? theirRuns.reduce((s, v) => s + v!, 0) / theirRuns.length : undefined;
    if (!reported) {
      this.missing(path, 'The mean K', item.item, item.itemKey, item.charge);
      return own;
    }
    const slips: Candidate[] = [{ value: 1 / ours.value, causes: ['inverted-constant'], basis: 'the inverse of the mean K' }];
    this.value({ ...item, what: 'The mean K', path, reported: Number(reported.value), unit: '', expected: ours.value, carried: { value: own, from: 'your own runs’ K' }, slips, tolerance: this.block.tolerances.K });
    return finite(Number(reported.value));
  }

  /** k_N and k_A split with the mean composition: one rubric item for the four. */
  rateLaw(refit: EquilibriumRefit, reported: Submission['reported'], theirMeanK: number | undefined): void {
    const x = theirMeanK === undefined ? undefined : fractionOf(theirMeanK);
    const item = { item: 'rateLawSplit', itemKey: 'rateLawSplit', charge: this.block.rubric.rateLawSplit };
    const constants = [
      { name: 'kNf', of: 'kN', label: 'k_N,f', forward: true },
      { name: 'kNr', of: 'kN', label: 'k_N,r', forward: false },
      { name: 'kAf', of: 'kA', label: 'k_A,f', forward: true },
      { name: 'kAr', of: 'kA', label: 'k_A,r', forward: false },
    ] as const;
    for (const c of constants) {
      const path = `reported.${c.name}`;
      const ours = refit[c.name]!;
      const other = refit[`${c.of}${c.forward ? 'r' : 'f'}` as const]!;
      const value = reported?.[c.name];
      if (!value) {
        this.missing(path, c.label, item.item, item.itemKey, item.charge);
        continue;
      }
      const unit = this.settings.units[c.of];
      const read = readReported(value, c.of === 'kN' ? 'first-order-rate' : 'second-order-rate', unit, unit, { path, what: c.label, stage: STAGE }, this.drafts);
      const theirK = reported?.[c.of] && readableIn(reported[c.of]!, unit)?.value;
      const share = (forward: boolean) => (x === undefined ? undefined : forward ? x : 1 - x);
      const own = theirK === undefined || share(c.forward) === undefined ? undefined : theirK * share(c.forward)!;
      const ownOther = theirK === undefined || share(!c.forward) === undefined ? undefined : theirK * share(!c.forward)!;
      const slips: Candidate[] = [{ value: other.value, causes: ['rate-constants-swapped'], basis: 'the other part' }];
      if (ownOther !== undefined) slips.push({ value: ownOther, causes: ['rate-constants-swapped'], basis: 'the other part from your own value and K' });
      this.value({ ...item, what: c.label, path, reported: read.value, unit, expected: ours.value, carried: { value: own, from: `your own ${c.of === 'kN' ? 'k_N' : 'k_A'} and mean K` }, slips, factors: DECIMAL_SHIFT, tolerance: this.block.tolerances.kSplit });
    }
  }
}

/** An x_B of ours outside 0 to 1: a finding on the data, at no cost; the run's equilibrium values are not graded. */
function outside(a: RunOutcome, ours: RunEquilibrium, block: Equilibrium): DraftFinding {
  const { A, B } = block.pureForms;
  return {
    code: 'composition-outside',
    path: `${a.path}.infinity`,
    stage: STAGE,
    severity: 'warning',
    charge: 0,
    reported: ours.xB.value,
    message:
      `With x_inf of run "${a.label}", [α]_eq = α_inf/(l c) = ${fmt(ours.specificRotation.value)} ${ours.specificRotation.unit}, outside the pure forms' ${fmt(B.value)} to ${fmt(A.value)}, ` +
      `so x_B = ${fmt(ours.xB.value)} lies outside 0 to 1: the specific rotations, the concentration or the end value cannot all be right. ` +
      'No K follows from it; the composition, K, k_f and k_r of this run are not graded. Please check the end value, the concentration made up and the cell length.',
  };
}

/**
 * The equilibrium block: each run's [α]_eq (where given), x_B, K, k_f and k_r, the mean K and the
 * split of k_N and k_A, each against our refit, or as following from the student's own earlier
 * numbers (then at no cost: a slip is charged where it entered, once).
 */
export function checkEquilibrium(
  block: Equilibrium,
  refit: EquilibriumRefit,
  analyses: RunOutcome[],
  studentKs: Array<StudentK | undefined>,
  submission: Submission,
  settings: Settings,
  drafts: DraftFinding[],
): EquilibriumItems {
  const checker = new EquilibriumChecker(block, settings, drafts);
  const theirKs: Array<number | undefined> = [];
  let runsWithK = 0;
  let runsWithSplit = 0;
  analyses.forEach((a, i) => {
    const ours = refit.runs[i];
    if (!ours) return;
    if (!ours.K) {
      drafts.push(outside(a, ours, block));
      return;
    }
    runsWithK += 1;
    if (ours.kf) runsWithSplit += 1;
    theirKs.push(checker.run(a, ours, submission.runs[i].reported, studentKs[i]));
  });
  const meanK = refit.meanK !== undefined;
  const theirMean = refit.meanK ? checker.meanK(refit.meanK, submission.reported?.K, theirKs) : undefined;
  const rateLawSplit = refit.kNf !== undefined;
  if (rateLawSplit) checker.rateLaw(refit, submission.reported, theirMean);
  return { runsWithK, runsWithSplit, meanK, rateLawSplit };
}
