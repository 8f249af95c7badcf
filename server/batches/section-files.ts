import { sectionTotals } from '../../kinds/documents.ts';
import { sectionSignalCollector } from '../../kinds/section-signals.ts';
import type { KindSettings, SummaryHeader } from '../../reports/feedback-input.ts';
import { GradebookRows } from '../../reports/gradebook-csv.ts';
import { renderSummaryOfTotals, type SectionTotals } from '../../reports/section-summary.ts';
import type { SectionSignals } from '../signals/section-report.ts';
import { jsonLinesOf } from './json-lines-file.ts';
import { withMoved } from './moved-buffers.ts';
import type { KeptResult } from './sheet-parts.ts';

export interface SectionFilesInput {
  /** The results kept as they came (`KeptResult` JSON lines, in file order); none without a file. */
  path: string | undefined;
  header: SummaryHeader;
  settings: KindSettings;
}

/**
 * `check --out`'s gradebook and summary, from the results it kept: read back one line at a time into
 * the gradebook's rows, the summary's running totals and the section's signals. A task of its own: the
 * command runs it in a worker whose heap is bounded, where the signals' comparison of a course leaves
 * tens of MB of garbage that the command's own thread let its heap grow by.
 */
export async function sectionFiles(input: SectionFilesInput): Promise<{ gradebook: string; summary: Uint8Array }> {
  const { gradebook, totals, signals } = await readBack(input);
  const summary = await renderSummaryOfTotals(totals, { header: input.header, signals });
  return withMoved({ gradebook, summary }, [summary]);
}

/** Each part let go once it has served (the gradebook's rows, the signals' copy of the readings), before the summary is drawn. */
async function readBack({ path, header, settings }: SectionFilesInput): Promise<{ gradebook: string; totals: SectionTotals; signals: SectionSignals }> {
  const gradebook = new GradebookRows({ assignment: header.assignment, bom: true });
  const totals = await sectionTotals(settings, true);
  const signals = sectionSignalCollector(settings);
  for await (const [result, ...read] of path === undefined ? [] : jsonLinesOf<KeptResult>(path)) {
    gradebook.add(result);
    // The result before its submission: a signal is placed from its student's last submission.
    totals.addResult(result);
    for (const submission of read) {
      totals.addSubmission(submission);
      signals.add(submission);
    }
  }
  return { gradebook: gradebook.text(), totals, signals: signals.finish() };
}
