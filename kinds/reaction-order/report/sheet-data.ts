import type { Refit, Settings, Submission } from '../schemas.ts';
import type { FeedbackInput } from '../../../reports/feedback-input.ts';
import { paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { FIT_COLUMNS, fitRows } from './fit-rows.ts';
import { drawLawPlots } from './law-plots.ts';
import { allLawSeries } from './law-series.ts';
import { LAWS } from './laws.ts';
import { refitOf } from './refit.ts';
import { HALF_LIFE_COLUMNS, halfLifeRows, VALUE_COLUMNS, valueRows } from './value-rows.ts';

const VALUE_WEIGHTS: Record<(typeof VALUE_COLUMNS)[number], number> = { Quantity: 1.2, Reported: 2.4, Refit: 2.3, Difference: 0.9, Tolerance: 1.3 };
const FIT_WEIGHTS: Record<(typeof FIT_COLUMNS)[number], number> = { Order: 0.5, 'Straight line': 1.1, 'k from the line': 1.9, 'k from the fit to [A]': 1.9, 'Residual SD': 1, 'Pattern p': 1, Refit: 0.8 };
const HALF_LIFE_WEIGHTS: Record<(typeof HALF_LIFE_COLUMNS)[number], number> = { Run: 0.9, '[A]_{0}': 1.1, Reacted: 0.8, 'Reported t_{1/2}': 1.3, 'Refit t_{1/2}': 1.6, Difference: 0.9, Tolerance: 0.8 };
const RIGHT = new Set(['Difference', 'Pattern p', 'Reacted']);

const columns = <C extends string>(names: readonly C[], weights: Record<C, number>) => names.map((header) => ({ header, weight: weights[header], ...(RIGHT.has(header) && { align: 'right' as const }) }));

/** How the tables read, for the student (`your`) or a TA (`the student’s`). */
export function valuesNote(whose: 'your' | 'the student’s'): string {
  return (
    `Refit: our own fits of ${whose} readings, converted to [A], by each order’s integrated law: its straight line and a fit to [A] itself (so that the noise lies where it was measured); values ± standard error. ` +
    `k is defined by −d[A]/dt = k[A]^{n}. Difference: (reported − refit) / refit, the reported value in the refit’s unit.`
  );
}

/** The sheet's part: order and k against ours, each order's fit and plot, the half-lives run by run. */
export function drawSheetData(doc: Doc, input: FeedbackInput<Settings, Submission, Refit>): void {
  const { settings, submission } = input;
  const refit = refitOf(input.result);
  if (!refit) return;
  sectionHeading(doc, 'Your order and k against the refit', 90);
  paragraph(doc, valuesNote('your'), { size: SIZE.small, color: COLOR.muted });
  const values = valueRows(settings, submission, refit);
  drawTable(doc, columns(VALUE_COLUMNS, VALUE_WEIGHTS), values, { zebra: true, keepRows: values.length });

  sectionHeading(doc, 'Each order’s fit', 80);
  paragraph(doc, 'Pattern p: the chance of residuals running in so long a pattern (Durbin-Watson) if the law were right; a small p is the mark of a curve the law does not follow. Residual SD in the unit of your readings.', { size: SIZE.small, color: COLOR.muted });
  const fits = fitRows(settings, refit);
  drawTable(doc, columns(FIT_COLUMNS, FIT_WEIGHTS), fits, { zebra: true, keepRows: fits.length });

  drawLawPlots(doc, allLawSeries(refit, submission.reported, settings.units.time));

  const halfLives = halfLifeRows(settings, submission, refit);
  if (halfLives.length === 0) return;
  sectionHeading(doc, 'Half-lives t_{1/2}, run by run', 60);
  paragraph(doc, `By the formula of order ${refit.gradedOrder}, the order reported: t_{1/2} = ${LAWS[refit.gradedOrder].halfLife}; for orders 0 and 2 it depends on the run’s [A]_{0}. Reacted: how much of [A]_{0} the run saw go.`, { size: SIZE.small, color: COLOR.muted });
  drawTable(doc, columns(HALF_LIFE_COLUMNS, HALF_LIFE_WEIGHTS), halfLives, { zebra: true, keepRows: Math.min(3, halfLives.length) });
}
