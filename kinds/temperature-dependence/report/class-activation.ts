import type { Refit, Settings, Submission } from '../schemas.ts';
import type { SectionSummaryInput } from '../../../reports/feedback-input.ts';
import { prettyUnit } from '../../../reports/format.ts';
import { paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { SPREAD_COLUMNS, spreadCells } from '../../../reports/summary/spread-table.ts';
import { SYMBOLS } from './symbols.ts';


/** The class's refitted E_a, ΔH‡ and ΔS‡: how far apart the students' own data put them. */
export function drawClassActivation(doc: Doc, input: SectionSummaryInput<Settings, Submission, Refit>): void {
  const refits = input.results.flatMap((r) => (r.status === 'checked' && r.refit ? [r.refit] : []));
  if (refits.length === 0) return;
  sectionHeading(doc, 'The class’s activation parameters', 120);
  paragraph(doc, 'Refit: our fit of each student’s own rate constants. SD is the sample standard deviation.');
  const rows = (['Ea', 'dH', 'dS'] as const).map((q) => [SYMBOLS[q], prettyUnit(refits[0][q].unit), ...spreadCells(refits.map((r) => r[q].value))]);
  drawTable(doc, [{ header: '', weight: 0.6 }, { header: 'Unit', weight: 1.3 }, ...SPREAD_COLUMNS], rows, { zebra: true, keepRows: rows.length });
}
