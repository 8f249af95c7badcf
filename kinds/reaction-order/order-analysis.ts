import { EngineError } from '../../server/engine/engine-error.ts';
import { convert, parseUnit } from '../../server/engine/units.ts';
import { fitLinearLaw, fitNonlinearLaw, halfLifeEstimate, initialFromIntercept, type LawOrder, type LinearLaw, type NonlinearLaw, type RunSeries } from './integrated-laws.ts';
import type { Refit, Settings, SubmittedRun } from './schemas.ts';
import { signalLine, toConcentration, type SignalLine } from './signal-conversion.ts';
import { varianceRatioP } from './variance-ratio.ts';

export const ORDERS: readonly LawOrder[] = [0, 1, 2];

/** k's unit for each order with times in `time`: M min^-1, min^-1, M^-1 min^-1. */
export function kUnitOf(order: LawOrder, time: string): string {
  return order === 0 ? `M ${time}^-1` : order === 1 ? `${time}^-1` : `M^-1 ${time}^-1`;
}

export interface LawFit {
  order: LawOrder;
  linear?: LinearLaw;
  nonlinear?: NonlinearLaw;
  notFitted?: string;
}

/** One law fitted both ways; a fit the data defeat is left out with the reason. */
function fitLaw(order: LawOrder, runs: readonly RunSeries[], time: string): LawFit {
  const unit = kUnitOf(order, time);
  const why: string[] = [];
  let linear: LinearLaw | undefined;
  try {
    linear = fitLinearLaw(order, runs, unit);
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    why.push(`linear form: ${error.message}`);
  }
  let nonlinear: NonlinearLaw | undefined;
  try {
    const c0 = runs.map((run, r) => (linear && initialFromIntercept(order, linear.intercepts[r])) || run.c[0]);
    const k = linear && Number.isFinite(linear.k.value) ? linear.k.value : 0;
    nonlinear = fitNonlinearLaw(order, runs, { k, c0 }, unit);
  } catch (error) {
    if (!(error instanceof EngineError)) throw error;
    why.push(`fit to the concentrations: ${error.message}`);
  }
  return { order, linear, nonlinear, notFitted: why.length ? why.join('; ') : undefined };
}

/** The k a law gives, fitted to the concentrations where it could be, else by its linear form. */
export const kOf = (fit: LawFit) => fit.nonlinear?.k ?? fit.linear?.k;

// Less than half reacted in every run is less than one half-life: over so short a stretch the three
// laws' curves differ by less than the scatter of a typical run (common practice, no source).
const LEAST_FRACTION = 0.5;
/** A pattern left in the residuals at this level marks a law the data do not follow (common practice, no source). */
const PATTERN_LEVEL = 0.01;
/** With a pattern, a law whose residual sum is this many times the best's is clearly worse (common practice, no source). */
const CLEARLY_WORSE = 1.5;
/** Without one, its residual sum must stand so far above the best's that equally good fits would leave them so apart less than once in a hundred. */
const RATIO_LEVEL = 0.01;

export interface RunData {
  label: string;
  series: RunSeries;
  /** [A]_0 in M: given, or the first converted reading. */
  c0: number;
  fractionReacted: number;
}

export interface OrderAnalysis {
  line: SignalLine;
  time: string;
  runs: RunData[];
  fits: Record<LawOrder, LawFit>;
  order: LawOrder | null;
  orderReason: string;
}

/** The runs as concentrations (M) against time in the instructor's unit, each value through `convertReading`. */
function runSeries(runs: readonly SubmittedRun[], time: string, convertReading: (signal: number) => number): RunData[] {
  return runs.map((run, i) => {
    const factor = convert(1, parseUnit(run.timeUnit, 'time', `runs[${i}].timeUnit`), time);
    const t = run.readings.map(([ti]) => ti * factor);
    const c = run.readings.map(([, x]) => convertReading(x));
    const c0 = run.initialConcentration ? convert(run.initialConcentration.value, parseUnit(run.initialConcentration.unit, 'concentration', `runs[${i}].initialConcentration.unit`), 'M') : c[0];
    return { label: run.label, series: { t, c }, c0, fractionReacted: 1 - c[c.length - 1] / c0 };
  });
}

function fitEveryLaw(runs: readonly RunData[], time: string): Record<LawOrder, LawFit> {
  const series = runs.map((r) => r.series);
  return { 0: fitLaw(0, series, time), 1: fitLaw(1, series, time), 2: fitLaw(2, series, time) };
}

const fmtShare = (x: number) => `${Math.round(100 * x)} %`;

/**
 * The order the data support: the law whose fit to the concentrations leaves the smallest residual
 * sum (every law has as many parameters), unless no run covers a half-life, when the laws cannot be
 * told apart.
 */
function nameOrder(runs: readonly RunData[], fits: Record<LawOrder, LawFit>): { order: LawOrder | null; reason: string } {
  const most = Math.max(...runs.map((r) => r.fractionReacted));
  if (!(most >= LEAST_FRACTION)) {
    return { order: null, reason: `the runs cover too little of the reaction to tell the orders apart: at most ${fmtShare(Math.max(most, 0))} of the reactant is used up, less than one half-life` };
  }
  const fitted = ORDERS.filter((n) => fits[n].nonlinear);
  if (fitted.length === 0) return { order: null, reason: 'no integrated law could be fitted to these readings' };
  const best = fitted.reduce((a, b) => (fits[b].nonlinear!.residualSS < fits[a].nonlinear!.residualSS ? b : a));
  const sums = fitted.map((n) => `order ${n}: ${fits[n].nonlinear!.residualSS.toPrecision(3)} M^2`).join(', ');
  const pattern = fits[best].nonlinear!.patternP < PATTERN_LEVEL ? '; its residuals still run in a pattern, so none of the three laws describes these runs well' : ', and its residuals show no pattern';
  return { order: best, reason: `order ${best} leaves the smallest residual sum of squares (${sums})${pattern}` };
}

export function analyseOrder(settings: Settings, runs: readonly SubmittedRun[]): OrderAnalysis {
  const line = signalLine(settings.signal);
  const time = settings.units.time;
  const data = runSeries(runs, time, (x) => toConcentration(line, x));
  const fits = fitEveryLaw(data, time);
  const { order, reason } = nameOrder(data, fits);
  return { line, time, runs: data, fits, order, orderReason: reason };
}

/**
 * Whether a law the student chose is clearly worse than the order named: a pattern in its residuals
 * with a residual sum well above the best's, or a residual sum so far above it that no pattern test is
 * needed (a short run has too few residuals for one to show).
 */
export function clearlyWorse(analysis: OrderAnalysis, order: LawOrder): boolean {
  if (analysis.order === null || analysis.order === order) return false;
  const theirs = analysis.fits[order].nonlinear;
  const best = analysis.fits[analysis.order].nonlinear!;
  if (!theirs) return true;
  const ratio = theirs.residualSS / best.residualSS;
  return (theirs.patternP < PATTERN_LEVEL && ratio > CLEARLY_WORSE) || varianceRatioP(ratio, best.dof) < RATIO_LEVEL;
}

/** The reported order against the data, as the refit names it. */
export function orderVerdictOf(analysis: OrderAnalysis, reported: LawOrder): Refit['orderVerdict'] {
  if (analysis.order === null) return 'undetermined';
  if (analysis.order === reported) return 'supported';
  return clearlyWorse(analysis, reported) ? 'not-supported' : 'not-ruled-out';
}

/** The refit as the result carries it, with k and half-lives by `gradedOrder`, the order reported. */
export function refitOf(analysis: OrderAnalysis, gradedOrder: LawOrder): Refit {
  const k = analysis.order === null ? null : (kOf(analysis.fits[analysis.order]) ?? null);
  const gradedK = kOf(analysis.fits[gradedOrder]);
  return {
    order: analysis.order,
    orderReason: analysis.orderReason,
    k,
    byOrder: ORDERS.map((n) => {
      const { linear, nonlinear, notFitted } = analysis.fits[n];
      return {
        order: n,
        linear: linear ?? null,
        nonlinear: nonlinear ? { ...nonlinear, residualSDSignal: Math.sqrt(nonlinear.residualSS / nonlinear.dof) * Math.abs(analysis.line.perMolar) } : null,
        ...(notFitted !== undefined && { notFitted }),
      };
    }),
    runs: analysis.runs.map((r) => ({
      label: r.label,
      times: [...r.series.t],
      concentrations: [...r.series.c],
      initialConcentration: r.c0,
      fractionReacted: r.fractionReacted,
      ...(gradedK && { halfLife: halfLifeEstimate(gradedOrder, gradedK, r.c0, analysis.time) }),
    })),
    gradedOrder,
    orderVerdict: orderVerdictOf(analysis, gradedOrder),
  };
}
