import type { Refit, Settings, Submission } from '../schemas.ts';
import { paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { valueRows, valuesNote } from './values-table.ts';

/** Reported against refit, per run and for the rate law, with units and tolerances. */
export function drawValues(doc: Doc, settings: Settings, submission: Submission, refit: Refit): void {
  const rows = valueRows(settings, submission, refit);
  if (rows.length === 0) return;
  sectionHeading(doc, 'Your values and the refit', 90);
  paragraph(doc, valuesNote(settings, 'your'), { size: SIZE.small, color: COLOR.muted });
  drawTable(
    doc,
    [
      { header: 'Quantity', weight: 1.05 },
      { header: 'Run', weight: 0.95 },
      { header: 'You reported', weight: 2.1 },
      { header: 'Refit from your data', weight: 2.3 },
      { header: 'Unit', weight: 1.1 },
      { header: 'Difference', weight: 1.15, align: 'right' },
      { header: 'Tolerance', weight: 1.55 },
    ],
    rows.map((r) => [r.quantity, r.run, r.reported, r.refit, r.unit, r.difference, r.tolerance]),
    { zebra: true, keepRows: 3 },
  );
}
