import type { Refit, Submission } from '../schemas.ts';
import type { KindSummaryPart } from '../../../reports/kind-report.ts';
import { prettyUnit } from '../../../reports/format.ts';
import { paragraph, sectionHeading } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { SPREAD_COLUMNS, spreadCells } from '../../../reports/summary/spread-table.ts';
import { SYMBOLS } from './symbols.ts';

const QUANTITIES = ['Ea', 'dH', 'dS'] as const;

/** The class's refitted E_a, ΔH‡ and ΔS‡: how far apart the students' own data put them. Keeps each checked refit's three values. */
export function classActivation(): KindSummaryPart<Submission, Refit> {
  const values = { Ea: [] as number[], dH: [] as number[], dS: [] as number[] };
  // The units of the first refit, as the table heads them.
  let units: Record<(typeof QUANTITIES)[number], string> | undefined;
  return {
    addResult(r) {
      if (r.status !== 'checked' || !r.refit) return;
      const refit = r.refit;
      units ??= { Ea: refit.Ea.unit, dH: refit.dH.unit, dS: refit.dS.unit };
      for (const q of QUANTITIES) values[q].push(refit[q].value);
    },
    addSubmission() {},
    draw(doc) {
      if (!units) return;
      sectionHeading(doc, 'The class’s activation parameters', 120);
      paragraph(doc, 'Refit: our fit of each student’s own rate constants. SD is the sample standard deviation.');
      const rows = QUANTITIES.map((q) => [SYMBOLS[q], prettyUnit(units![q]), ...spreadCells(values[q])]);
      drawTable(doc, [{ header: '', weight: 0.6 }, { header: 'Unit', weight: 1.3 }, ...SPREAD_COLUMNS], rows, { zebra: true, keepRows: rows.length });
    },
  };
}
