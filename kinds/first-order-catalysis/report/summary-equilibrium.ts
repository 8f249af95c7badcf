import type { Settings } from '../schemas.ts';
import { ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { SPREAD_COLUMNS } from '../../../reports/summary/spread-table.ts';
import type { ClassValues } from './class-values.ts';
import { drawStripPlot } from './strip-plot.ts';
import { spreadRow } from './summary-rate-constants.ts';

/** With the equilibrium block: the spread of the section's K per run (`submissions`: whether the reported were given), and its strip plot. */
export function drawEquilibriumSummary(doc: Doc, settings: Settings, values: ClassValues, submissions: boolean): void {
  if (!settings.equilibrium) return;
  if (values.refit.length + values.reported.length === 0) return;
  sectionHeading(doc, 'The section’s equilibrium constant K, run by run', 150);
  paragraph(
    doc,
    'K = x_{B}/x_{A} from each run’s end value. The catalyst speeds both directions alike, so K should be the same in every run of every student: ' +
      'a mark far from the rest points to an end value read before equilibrium or a solution made up at another concentration (each such run is signalled for review).',
    { size: SIZE.small, color: COLOR.muted },
  );
  const rows = [spreadRow(values, 'refit', values.refit), ...(submissions ? [spreadRow(values, 'reported', values.reported)] : [])];
  drawTable(doc, [{ header: '', weight: 0.5 }, { header: 'Source', weight: 0.9 }, ...SPREAD_COLUMNS, { header: 'Reference band', weight: 1.6 }, { header: 'Outside band', weight: 1.1, align: 'right' }], rows, { zebra: true, keepRows: rows.length });
  ensureSpace(doc, 130);
  moveTo(doc, doc.y + 6);
  drawStripPlot(doc, values);
}
