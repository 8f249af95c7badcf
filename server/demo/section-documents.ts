import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { Kysely } from 'kysely';
import type { FeedbackInput } from '../../reports/feedback-input.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import { sectionFeedback, sectionResults } from '../grading/report-inputs.ts';
import type { Database } from '../store/database.ts';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';

/** One assignment of the demo section as a TA downloads it: every sheet, the summary and the gradebook, in `dir`. */
export async function writeSectionDocuments(
  db: Kysely<Database>,
  place: { courseName: string; sectionName: string; sectionId: number; assignmentId: number; title: string },
  dir: string,
): Promise<FeedbackInput[]> {
  await mkdir(dir, { recursive: true });
  const inputs = await sectionFeedback(db, place.sectionId, place.assignmentId);
  for (const input of inputs) await writeFile(join(dir, `${input.header.studentId}.pdf`), await feedbackSheet({ ...input, invented: true }));
  const submissions = inputs.map((i) => i.submission);
  await writeFile(
    join(dir, 'summary.pdf'),
    await sectionSummary({
      header: { course: place.courseName, section: place.sectionName, assignment: place.title, gradedAt: new Date() },
      settings: inputs[0].settings,
      results: inputs.map((i) => i.result),
      submissions,
      signals: sectionSignals(inputs[0].settings, submissions),
      invented: true,
    }),
  );
  await writeFile(join(dir, 'gradebook.csv'), gradebookCsv(await sectionResults(db, place.sectionId, place.assignmentId), { assignment: place.title, bom: true }));
  return inputs;
}
