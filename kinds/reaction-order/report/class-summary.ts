import type { Refit, Submission } from '../schemas.ts';
import type { KindSummaryPart } from '../../../reports/kind-report.ts';
import { prettyUnit } from '../../../reports/format.ts';
import { paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { SPREAD_COLUMNS, spreadCells } from '../../../reports/summary/spread-table.ts';
import { ClassTotals } from './class-values.ts';

/** The summary's part: the orders the class's data name against those reported, and the class's k by order. */
export function classOrdersAndK(): KindSummaryPart<Submission, Refit> {
  const totals = new ClassTotals();
  return {
    addResult: (result) => totals.addResult(result),
    addSubmission: (submission) => totals.addSubmission(submission),
    draw: (doc, withSubmissions) => drawClassOrdersAndK(doc, totals, withSubmissions),
  };
}

/** `submissions`: whether the reported values were given. */
function drawClassOrdersAndK(doc: Doc, totals: ClassTotals, submissions: boolean): void {
  const orders = totals.orders();
  const total = orders.named.reduce((a, b) => a + b, 0);
  if (total === 0) return;
  sectionHeading(doc, 'The class’s order', 110);
  paragraph(
    doc,
    `Named by the refit: the order each student’s own readings support, or “cannot tell” where the runs cover too little of the reaction. Reported: the order each student handed in` +
      (submissions ? `; ${orders.agreeing} of ${total} reported the order their data name.` : ' (not given for this summary).'),
    { size: SIZE.small, color: COLOR.muted },
  );
  const labels = ['Order 0', 'Order 1', 'Order 2', 'Cannot tell'];
  const rows = labels.map((label, i) => [label, String(orders.named[i]), submissions ? (i < 3 ? String(orders.reported[i]) : '—') : '—']);
  drawTable(doc, [{ header: '', weight: 1.2 }, { header: 'Named by the refit', weight: 1.4, align: 'right' }, { header: 'Reported', weight: 1.4, align: 'right' }, { header: '', weight: 3 }], rows.map((r) => [...r, '']), { zebra: true, keepRows: rows.length });

  const ks = totals.ks();
  if (ks.length === 0) return;
  sectionHeading(doc, 'The class’s k, by order', 110);
  paragraph(
    doc,
    'Refit: k of the order each student’s data name, from our fit to [A]. Reported: the k of the students who reported that order, converted to its unit. Each order’s k has its own unit (M^{1−n} per time), so they are never pooled. SD is the sample standard deviation.',
    { size: SIZE.small, color: COLOR.muted },
  );
  // A source with no value for an order (no student's data name it, say) has no row.
  const kRows = ks.flatMap((k) => [
    ...(k.refit.length ? [[`k, order ${k.order}`, prettyUnit(k.unit), 'refit', ...spreadCells(k.refit)]] : []),
    ...(submissions && k.reported.length ? [[`k, order ${k.order}`, prettyUnit(k.unit), 'reported', ...spreadCells(k.reported)]] : []),
  ]);
  drawTable(doc, [{ header: '', weight: 1 }, { header: 'Unit', weight: 1.1 }, { header: 'Source', weight: 0.8 }, ...SPREAD_COLUMNS], kRows, { zebra: true, keepRows: kRows.length });
  const unreadable = ks.reduce((n, k) => n + k.unreadable, 0);
  if (unreadable > 0) paragraph(doc, `${unreadable} reported k left out: its unit could not be read as the unit of its order’s k.`, { size: SIZE.small, color: COLOR.muted });
}
