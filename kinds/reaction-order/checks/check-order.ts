import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import type { LawOrder } from '../integrated-laws.ts';
import { orderVerdictOf, type OrderAnalysis } from '../order-analysis.ts';
import type { Settings } from '../schemas.ts';

const sum = (analysis: OrderAnalysis, n: LawOrder) => analysis.fits[n].nonlinear?.residualSS.toPrecision(3);

/**
 * The reported order against the data: charged only where the law they chose is clearly worse (see
 * clearlyWorse); a law the data favour only slightly over theirs is named in a note. Either way k and
 * the half-lives are then checked by the law of their order, so the order is charged once, here.
 */
export function checkOrder(settings: Settings, analysis: OrderAnalysis, reported: LawOrder, drafts: DraftFinding[]): void {
  const path = 'reported.order';
  const verdict = orderVerdictOf(analysis, reported);
  if (verdict === 'undetermined') {
    drafts.push({ code: 'order-undetermined', path, stage: 'order', severity: 'info', charge: 0, message: `The order could not be checked: ${analysis.orderReason}. Your order ${reported} is taken as it is, and k is checked by its law.` });
    return;
  }
  if (verdict === 'supported' || analysis.order === null) return;
  const named = analysis.order;
  if (verdict === 'not-ruled-out') {
    drafts.push({
      code: 'order-not-supported',
      path,
      stage: 'order',
      severity: 'info',
      charge: 0,
      message: `The data favour order ${named} slightly (residual sum of squares ${sum(analysis, named)} M^2 against ${sum(analysis, reported) ?? 'none'} M^2 for order ${reported}), but not clearly enough to rule out your order ${reported}; k is checked by your order’s law.`,
    });
    return;
  }
  const p = analysis.fits[reported].nonlinear?.patternP;
  drafts.push({
    code: 'order-not-supported',
    path,
    stage: 'order',
    reported,
    expected: named,
    rubricItem: 'order',
    itemKey: 'order',
    severity: 'error',
    charge: settings.rubric.order,
    message:
      `You report order ${reported}, but the data support order ${named}: ${analysis.orderReason}. ` +
      (p === undefined
        ? `The order-${reported} law could not be fitted to these readings. `
        : `The order-${reported} law leaves a residual sum of squares of ${sum(analysis, reported)} M^2 against ${sum(analysis, named)} M^2${p < 0.01 ? `, in a pattern (Durbin-Watson p = ${p.toPrecision(2)}), the mark of a curve the law does not follow` : ''}. `) +
      `Please compare the three plots ([A], ln [A] and 1/[A] against t) and see which is straight over the whole run. ` +
      `Your k and half-lives are checked by the law of order ${reported}, so that this costs points once, here.`,
  });
}
