import type { Refit, Settings } from '../schemas.ts';
import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { LAWS } from './laws.ts';
import { estimateText } from './value-rows.ts';

/**
 * Each order's fit side by side: k from its straight line and from the fit to the concentrations,
 * the residuals' scatter in the signal's own unit, and the chance of their run (Durbin-Watson) if the
 * law were right. A small p is the mark of a curve the law does not follow.
 */
export const FIT_COLUMNS = ['Order', 'Straight line', 'k from the line', 'k from the fit to [A]', 'Residual SD', 'Pattern p', 'Refit'] as const;

/** The unit residuals are printed in: the signal's (absorbance has none). */
export function signalUnit(settings: Settings): string {
  return settings.signal.type === 'absorbance' ? '' : prettyUnit(settings.signal.unit);
}

export function fitRows(settings: Settings, refit: Refit): string[][] {
  return refit.byOrder.map((fit) => {
    const named = refit.order === fit.order ? 'named' : fit.order === refit.gradedOrder ? 'reported' : '';
    const nonlinear = fit.nonlinear;
    return [
      String(fit.order),
      `${LAWS[fit.order].plotted} against t`,
      fit.linear ? estimateText(fit.linear.k) : (fit.notFitted ?? 'not fitted'),
      nonlinear ? estimateText(nonlinear.k) : fit.linear ? 'not fitted' : '—',
      nonlinear ? `${formatNumber(nonlinear.residualSDSignal, 2)} ${signalUnit(settings)}`.trim() : '—',
      nonlinear ? formatNumber(nonlinear.patternP, 2) : '—',
      named,
    ];
  });
}
