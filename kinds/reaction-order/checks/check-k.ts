import type { ReportedValue } from '../../../schemas/common.ts';
import { slipMatch } from '../../../server/checks/cause-tolerance.ts';
import { checkValue, type ValueOutcome } from '../../../server/checks/check-value.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { CONCENTRATION_UNIT, DECIMAL_SHIFT, LOG_BASE, SIGN, TIME_UNIT, type Candidate, type Factor } from '../../../server/checks/explain.ts';
import { withUnit } from '../../../server/checks/format.ts';
import type { ReadValue } from '../../../server/checks/reported-number.ts';
import { roundingOf, roundingOfUncertainty } from '../../../server/checks/rounding-rule.ts';
import { withinTolerance } from '../../../server/checks/tolerance.ts';
import type { LawOrder } from '../integrated-laws.ts';
import { kOf, kUnitOf, ORDERS, type OrderAnalysis } from '../order-analysis.ts';
import type { Settings, SubmittedRun } from '../schemas.ts';
import { orderCauses } from './causes.ts';
import { acceptedK, type AcceptedK } from './accepted-k.ts';
import { signalSlipKs, type SlipK } from './signal-slips.ts';

/** The scalings a slip can give k of each order: ln for order 1 only, [A]'s unit for orders 0 and 2. */
export function kFactors(order: LawOrder, withSign = true): Factor[] {
  return [...(withSign ? [SIGN] : []), ...(order === 1 ? [LOG_BASE] : []), ...TIME_UNIT, ...(order === 1 ? [] : CONCENTRATION_UNIT), ...DECIMAL_SHIFT];
}

export interface KContext {
  settings: Settings;
  analysis: OrderAnalysis;
  runs: readonly SubmittedRun[];
  /** k and the half-lives are checked by the law of the order reported: an order the data do not support is charged once, at the order. */
  reportedOrder: LawOrder;
}

const STOICHIOMETRIC_NOTE =
  'This is half the k of −d[A]/dt = k[A]^n: the rate constant of 2A → P written for the rate of reaction, −(1/2) d[A]/dt = k′[A]^n, a convention in use. It is accepted; the assignment’s k is the rate of loss of A, twice yours.';

/** The reported k against ours by the law of the order reported. */
export function checkK(c: KContext, reported: ReportedValue, read: ReadValue, drafts: DraftFinding[]): void {
  const { settings, analysis, reportedOrder } = c;
  const ours = kOf(analysis.fits[reportedOrder]);
  const unit = kUnitOf(reportedOrder, analysis.time);
  if (!ours) {
    drafts.push({ code: 'refit-note', path: 'reported.k', stage: 'order', severity: 'info', charge: 0, message: `k could not be checked: ${analysis.fits[reportedOrder].notFitted ?? 'the law could not be fitted'}.` });
    return;
  }
  const accepted = acceptedK(analysis, reportedOrder);
  const halves = accepted.values.map((v) => v / 2);
  const tolerance = settings.tolerances.k;
  const slips = methodSlips(c);
  const outcome = checkValue(
    {
      what: 'k',
      path: 'reported.k',
      stage: 'order',
      rubricItem: 'k',
      itemKey: 'k',
      charge: settings.rubric.k,
      reported: read.value,
      unit,
      expected: ours.value,
      alsoRight: [...accepted.values.slice(1), ...halves],
      // The other accepted methods stand as bases too, so that a slip of theirs (log10 on the linear form) is named.
      slips: () => [...accepted.values.slice(1).map((value, i): Candidate => ({ value, causes: [], basis: accepted.bases[i + 1] })), ...slips()],
      factors: kFactors(reportedOrder),
      causes: orderCauses,
      tolerance,
      rounding: roundingOf(reported.value, read.uncertainty, ours.standardError, settings.rubric.sigFigs),
    },
    drafts,
  );
  const stoichiometric = outcome.kind === 'right' && !accepted.values.some((v) => withinTolerance(read.value, v, tolerance)) && halves.some((v) => withinTolerance(read.value, v, tolerance));
  if (stoichiometric) {
    drafts.push({ code: 'stoichiometric-k', path: 'reported.k', stage: 'order', reported: read.value, expected: ours.value, unit, severity: 'info', charge: 0, message: `k is ${withUnit(read.value, unit)}; the refit gives ${withUnit(ours.value, unit)}. ${STOICHIOMETRIC_NOTE}` });
  }
  if (settings.rubric.kUncertainty > 0) checkKUncertainty(c, reported, read, accepted, slips, stoichiometric, kScale(outcome, accepted), drafts);
}

/**
 * The k that slips of method give, each with its SE (so a slip named on k is named on its SE too,
 * counted once): another order's line, and the Beer-Lambert slips under the student's law. Worked
 * out once, when first asked for.
 */
function methodSlips(c: KContext): () => SlipK[] {
  let made: SlipK[] | undefined;
  return () => {
    made ??= [
      ...ORDERS.filter((m) => m !== c.reportedOrder).flatMap((m) => {
        const other = acceptedK(c.analysis, m);
        return other.values.map((value, i) => ({ value, se: other.standardErrors[i], causes: ['other-order-law'], basis: `the k of the order-${m} line (${LINE[m]} against t)`, detail: `order ${m}`, closestWins: true }));
      }),
      ...signalSlipKs(c.settings, c.analysis, c.runs.map((run) => run.readings), c.reportedOrder, acceptedK(c.analysis, c.reportedOrder)),
    ];
    return made;
  };
}

const LINE: Record<LawOrder, string> = { 0: '[A]', 1: 'ln [A]', 2: '1/[A]' };

/**
 * How much a slip of units, log base or a decimal point scaled k, where k is an accepted value so
 * scaled: its SE carries the same factor, already charged at k.
 */
function kScale(outcome: ValueOutcome, accepted: AcceptedK): number | undefined {
  if (outcome.kind !== 'explained' || outcome.by.root === 0 || !accepted.values.includes(outcome.by.root)) return undefined;
  return Math.abs(outcome.by.value / outcome.by.root);
}

/** Of the accepted SEs scaled by k's slip, the one nearest the reported SE (by ratio). */
function carriedSE(accepted: AcceptedK, scale: number, reported: number): number {
  const off = (se: number) => Math.abs(Math.log(Math.abs(reported) / se));
  return accepted.standardErrors.map((se) => se * scale).reduce((best, se) => (off(se) < off(best) ? se : best));
}

/**
 * The SE of k; halved with k where k is written by the 2A → P convention (`stoichiometric`), and
 * scaled with it where a slip scaled k (`kScaled`): carried forward, charged once, at k.
 */
function checkKUncertainty(c: KContext, reported: ReportedValue, read: ReadValue, accepted: AcceptedK, slips: () => SlipK[], stoichiometric: boolean, kScaled: number | undefined, drafts: DraftFinding[]): void {
  const { settings, analysis, reportedOrder } = c;
  const path = 'reported.k.uncertainty';
  const charge = settings.rubric.kUncertainty;
  if (read.uncertainty === undefined) {
    drafts.push({ code: 'missing-value', path, stage: 'order', rubricItem: 'kUncertainty', itemKey: 'kUncertainty', severity: 'error', charge, message: 'The standard error of k is missing.' });
    return;
  }
  const [expected, ...others] = accepted.standardErrors;
  checkValue(
    {
      what: 'The standard error of k',
      path,
      stage: 'order',
      rubricItem: 'kUncertainty',
      itemKey: 'kUncertainty',
      charge,
      reported: read.uncertainty,
      unit: kUnitOf(reportedOrder, analysis.time),
      expected,
      alsoRight: [...others, ...(stoichiometric ? accepted.standardErrors.map((se) => se / 2) : [])],
      ...(kScaled !== undefined && { carriedForward: { value: carriedSE(accepted, kScaled, read.uncertainty), from: 'your k, with the slip named there' } }),
      slips: () => slips().map(({ se, ...slip }) => ({ ...slip, value: Math.abs(se), basis: `the standard error that goes with ${slip.basis}` })),
      factors: kFactors(reportedOrder, false),
      causes: orderCauses,
      tolerance: settings.tolerances.kUncertainty,
      causeTolerance: () => slipMatch(reported.uncertainty!, read.uncertainty!, settings.tolerances.kUncertainty),
      rounding: roundingOfUncertainty(reported.uncertainty!),
    },
    drafts,
  );
}
