import type { Refit, Settings, Submission } from '../schemas.ts';
import { paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { equilibriumNote, equilibriumRows } from './equilibrium-rows.ts';

/** The sheet's block on the equilibrium: each run's composition and split of k, yours against ours. */
export function drawEquilibrium(doc: Doc, settings: Settings, submission: Submission, refit: Refit): void {
  const block = settings.equilibrium;
  if (!block || !refit.equilibrium) return;
  const rows = equilibriumRows(block, submission, refit.equilibrium);
  if (rows.length === 0) return;
  sectionHeading(doc, 'Equilibrium: composition, K, k_{f} and k_{r}', 90);
  paragraph(doc, equilibriumNote(block, refit.equilibrium, 'your'), { size: SIZE.small, color: COLOR.muted });
  drawTable(
    doc,
    [
      { header: 'Quantity', weight: 1.05 },
      { header: 'Run', weight: 0.95 },
      { header: 'You reported', weight: 1.7 },
      { header: 'Refit from your data', weight: 2.3 },
      { header: 'Unit', weight: 1.5 },
      { header: 'Difference', weight: 1.15, align: 'right' },
      { header: 'Tolerance', weight: 1.2 },
    ],
    rows.map((r) => [r.quantity, r.run, r.reported, r.refit, r.unit, r.difference, r.tolerance]),
    { zebra: true, keepRows: 5 },
  );
}
