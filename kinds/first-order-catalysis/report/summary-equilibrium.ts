import type { Refit, Settings, Submission } from '../schemas.ts';
import type { SectionSummaryInput } from '../../../reports/feedback-input.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { SPREAD_COLUMNS } from '../../../reports/summary/spread-table.ts';
import type { ClassValues } from './class-values.ts';
import { readRefit } from './refit.ts';
import { drawStripPlot } from './strip-plot.ts';
import { spreadRow } from './summary-rate-constants.ts';

/** The section's K run by run: our refit of each run's end value, and (with the submissions) each run's K as reported. */
export function classConstants(results: readonly CheckResult[], submissions: readonly Submission[] | undefined): ClassValues {
  const byId = new Map<string, Submission>();
  for (const s of submissions ?? []) if (!byId.has(s.studentId)) byId.set(s.studentId, s);
  const values: ClassValues = { quantity: 'K', per: 'run', unit: '', refit: [], reported: [], unreadable: 0 };
  for (const result of results) {
    if (result.status !== 'checked') continue;
    const runs = readRefit(result)?.equilibrium?.runs ?? [];
    for (const run of runs) if (run?.K) values.refit.push(run.K.value);
    const submission = result.studentId === null ? undefined : byId.get(result.studentId);
    for (const run of submission?.runs ?? []) {
      const K = run.reported?.K;
      if (!K) continue;
      const value = Number(K.value);
      if (Number.isFinite(value)) values.reported.push(value);
      else values.unreadable += 1;
    }
  }
  return values;
}

/** With the equilibrium block: the spread of the section's K per run, and its strip plot. */
export function drawEquilibriumSummary(doc: Doc, input: SectionSummaryInput<Settings, Submission, Refit>): void {
  if (!input.settings.equilibrium) return;
  const values = classConstants(input.results, input.submissions);
  if (values.refit.length + values.reported.length === 0) return;
  sectionHeading(doc, 'The section’s equilibrium constant K, run by run', 150);
  paragraph(
    doc,
    'K = x_{B}/x_{A} from each run’s end value. The catalyst speeds both directions alike, so K should be the same in every run of every student: ' +
      'a mark far from the rest points to an end value read before equilibrium or a solution made up at another concentration (each such run is signalled for review).',
    { size: SIZE.small, color: COLOR.muted },
  );
  const rows = [spreadRow(values, 'refit', values.refit), ...(input.submissions ? [spreadRow(values, 'reported', values.reported)] : [])];
  drawTable(doc, [{ header: '', weight: 0.5 }, { header: 'Source', weight: 0.9 }, ...SPREAD_COLUMNS, { header: 'Reference band', weight: 1.6 }, { header: 'Outside band', weight: 1.1, align: 'right' }], rows, { zebra: true, keepRows: rows.length });
  ensureSpace(doc, 130);
  moveTo(doc, doc.y + 6);
  drawStripPlot(doc, values);
}
