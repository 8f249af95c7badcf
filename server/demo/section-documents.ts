import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import type { FeedbackInput } from '../../reports/feedback-input.ts';
import { documentName, sheetDocumentName } from '../../reports/file-names.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import { sectionFeedback, sectionResults } from '../grading/report-inputs.ts';
import type { Database } from '../store/database.ts';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';

/**
 * One assignment of the demo section as a TA downloads it: every sheet, the summary and the gradebook,
 * in `dir`, each named as the service names the download (course, section, assignment, what it is), so
 * files from several sections or assignments say what they are. Returns the sheets' inputs and the
 * names of the summary and the gradebook.
 */
export async function writeSectionDocuments(
  db: Kysely<Database>,
  place: { courseName: string; sectionName: string; sectionId: number; assignmentId: number; title: string },
  dir: string,
): Promise<{ inputs: FeedbackInput[]; summary: string; gradebook: string }> {
  await mkdir(dir, { recursive: true });
  const inputs = await sectionFeedback(db, place.sectionId, place.assignmentId);
  for (const input of inputs) await writeFile(join(dir, sheetDocumentName(input.header).ascii), await feedbackSheet({ ...input, invented: true }));
  const submissions = inputs.map((i) => i.submission);
  const named = (what: string, extension: string) => documentName([place.courseName, place.sectionName, place.title], what, extension).ascii;
  const [summary, gradebook] = [named('summary', '.pdf'), named('gradebook', '.csv')];
  await writeFile(
    join(dir, summary),
    await sectionSummary({
      header: { course: place.courseName, section: place.sectionName, assignment: place.title, gradedAt: new Date() },
      settings: inputs[0].settings,
      results: inputs.map((i) => i.result),
      submissions,
      signals: sectionSignals(inputs[0].settings, submissions),
      invented: true,
    }),
  );
  const { results, held } = await sectionResults(db, place.sectionId, place.assignmentId);
  await writeFile(join(dir, gradebook), gradebookCsv(results, { assignment: place.title, bom: true, held }));
  return { inputs, summary, gradebook };
}
