import type { ReportedValue } from '../../../schemas/common.ts';
import { checkValue } from '../../../server/checks/check-value.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { DECIMAL_SHIFT, SIGN, TIME_UNIT, type Candidate } from '../../../server/checks/explain.ts';
import { readReported } from '../../../server/checks/reported-number.ts';
import { roundingOf } from '../../../server/checks/rounding-rule.ts';
import { halfLifeFormula, type LawOrder } from '../integrated-laws.ts';
import { kOf, ORDERS } from '../order-analysis.ts';
import { acceptedK } from './accepted-k.ts';
import type { KContext } from './check-k.ts';
import { orderCauses } from './causes.ts';
import { bendingSlips, scalingSlips } from './signal-slips.ts';
import { toConcentration } from '../signal-conversion.ts';

const FORMULA: Record<LawOrder, string> = { 0: '[A]_0/(2k)', 1: 'ln 2/k', 2: '1/(k[A]_0)' };

/**
 * Each run's reported half-life against the reported order's formula with our k and the run's [A]_0
 * (given, the first reading, or the fitted one: each is right). `theirK` is the student's own k, in the
 * instructor's unit of the order they report, where it could be read: a half-life that follows from
 * it with their order's formula is carried forward, never charged again.
 */
export function checkHalfLives(c: KContext, theirK: number | undefined, drafts: DraftFinding[]): void {
  const { settings, analysis, reportedOrder } = c;
  const charge = settings.rubric.halfLife;
  if (charge <= 0) return;
  const ours = kOf(analysis.fits[reportedOrder]);
  const ks = acceptedK(analysis, reportedOrder).values;
  const fittedC0 = analysis.fits[reportedOrder].nonlinear?.initialConcentrations;
  const unit = settings.units.time;
  const signalC0s = [
    ...scalingSlips(settings).map((slip) => ({ ...slip, c0: (x: number) => toConcentration(analysis.line, x) * slip.scale })),
    ...bendingSlips(settings, analysis.line).map((slip) => ({ ...slip, c0: slip.concentration })),
  ];
  c.runs.forEach((run, r) => {
    const path = `runs[${r}].reported.halfLife`;
    const itemKey = `halfLife@runs[${r}]`;
    const what = `The half-life of run “${run.label}”`;
    const reported: ReportedValue | undefined = run.reported?.halfLife;
    if (!reported) {
      drafts.push({ code: 'missing-value', path, stage: 'half-life', rubricItem: 'halfLife', itemKey, severity: 'error', charge, message: `${what} is missing.` });
      return;
    }
    if (!ours) return;
    const read = readReported(reported, 'time', unit, unit, { path, what: `the half-life of run “${run.label}”`, stage: 'half-life' }, drafts);
    const c0s = [analysis.runs[r].c0, ...(fittedC0 ? [fittedC0[r]] : [])];
    const expected = halfLifeFormula(reportedOrder, ours.value, analysis.runs[r].c0);
    const rights = ks.flatMap((k) => c0s.map((c0) => halfLifeFormula(reportedOrder, k, c0)));
    const carried = theirK === undefined ? undefined : halfLifeFormula(reportedOrder, theirK, analysis.runs[r].c0);
    // [A]_0 read from the first reading (where none is given) with a slip of the signal: the slip shows
    // here even where k hides it (A_inf left in shifts a zero-order line without tilting it).
    const slipC0 = (): Candidate[] =>
      run.initialConcentration || theirK === undefined
        ? []
        : signalC0s.map((slip) => ({ value: halfLifeFormula(reportedOrder, theirK, slip.c0(run.readings[0][1])), causes: [slip.code], basis: `your k with [A]_0 from ${slip.detail}`, detail: slip.detail, closestWins: true }));
    const otherFormulas = (): Candidate[] =>
      ORDERS.filter((m) => m !== reportedOrder).flatMap((m) =>
        [ours.value, ...(theirK === undefined ? [] : [theirK])].map((k) => ({ value: halfLifeFormula(m, k, analysis.runs[r].c0), causes: ['half-life-formula'], basis: `the order-${m} formula ${FORMULA[m]}`, detail: `${FORMULA[m]} used`, closestWins: true })),
      );
    checkValue(
      {
        what,
        path,
        stage: 'half-life',
        rubricItem: 'halfLife',
        itemKey,
        charge,
        reported: read.value,
        unit,
        expected,
        alsoRight: rights,
        carriedForward: carried === undefined ? undefined : { value: carried, from: 'your k and the formula for your order' },
        slips: () => [...otherFormulas(), ...slipC0()],
        factors: [SIGN, ...TIME_UNIT, ...DECIMAL_SHIFT],
        causes: orderCauses,
        tolerance: settings.tolerances.halfLife,
        rounding: roundingOf(reported.value, read.uncertainty, undefined, settings.rubric.sigFigs),
      },
      drafts,
    );
  });
}
