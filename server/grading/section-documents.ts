import type { Readable } from 'node:stream';
import type { Kysely } from 'kysely';
import { documentName } from '../../reports/file-names.ts';
import { sectionZip } from '../../reports/section-zip.ts';
import type { Database } from '../store/database.ts';
import { reportNames } from '../store/names.ts';
import type { Grader } from './grader.ts';
import { sectionFeedback } from './report-inputs.ts';

/** A drawn download's file name (ASCII, and in full). */
export interface DocumentName {
  ascii: string;
  unicode: string;
}

/** The course, section and assignment a download is named after, in that order. */
export const placeOf = (names: { course: string; section: string; assignment: string }) => [names.course, names.section, names.assignment];

/**
 * Every student's feedback sheet in one ZIP, streamed: what each student was shown, or the latest
 * result (a draft) where nothing was released. `drawn` hears how many sheets are drawn so far.
 * The same for the download drawn in its request and for the one a job draws.
 */
export async function sectionFeedbackZip(db: Kysely<Database>, grader: Grader, sectionId: number, assignmentId: number, drawn?: (count: number) => void): Promise<{ name: DocumentName; zip: Readable }> {
  const inputs = await sectionFeedback(db, sectionId, assignmentId);
  const name = documentName(placeOf(await reportNames(db, sectionId, assignmentId)), 'feedback', '.zip');
  const sheets = grader.renderSheets(inputs.map((input) => ({ input })));
  return { name, zip: sectionZip(drawn ? counted(sheets, drawn) : sheets) };
}

async function* counted<T>(items: AsyncIterable<T>, drawn: (count: number) => void): AsyncIterable<T> {
  let count = 0;
  for await (const item of items) {
    yield item;
    drawn(++count);
  }
}

/** The section summary (PDF) of the latest results, released or not (it is for the TAs); undefined with none checked. */
export async function sectionSummaryPdf(db: Kysely<Database>, grader: Grader, sectionId: number, assignmentId: number): Promise<{ name: DocumentName; pdf: Buffer } | undefined> {
  const inputs = await sectionFeedback(db, sectionId, assignmentId, 'latest');
  if (inputs.length === 0) return undefined;
  const pdf = await grader.renderSummary({
    header: { course: inputs[0].header.course, section: inputs[0].header.section, assignment: inputs[0].header.assignment, gradedAt: new Date() },
    settings: inputs[0].settings,
    results: inputs.map((i) => i.result),
    submissions: inputs.map((i) => i.submission),
    signals: await grader.sectionSignals(inputs[0].settings, inputs.map((i) => i.submission)),
  });
  return { name: documentName(placeOf(inputs[0].header), 'summary', '.pdf'), pdf };
}
