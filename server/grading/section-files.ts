import { randomUUID } from 'node:crypto';
import { buffer } from 'node:stream/consumers';
import type { Kysely } from 'kysely';
import type { JobQueue, QueueSpec } from '../jobs/job-queue.ts';
import type { Database } from '../store/database.ts';
import { countSectionFileDone, createSectionFile, failSectionFile, finishSectionFile, sectionFileToDraw, type SectionDocument, type SectionFileRow } from '../store/section-files.ts';
import { latestSubmissionIds } from '../store/submissions.ts';
import type { Grader } from './grader.ts';
import { sectionFeedbackZip, sectionSummaryPdf } from './section-documents.ts';

/** The job's data: which file to draw. */
export interface SectionFileJob {
  fileId: string;
}

/** A large section's file: one job, tried again if its process dies mid-way (a ZIP of 1,000 sheets takes minutes on two cores). */
export const SECTION_FILES: QueueSpec = { name: 'section-file', retryLimit: 3, retryDelaySeconds: 5, expireInSeconds: 900, deadLetter: 'section-file-given-up' };
/** Files whose tries are used up come here, to be marked failed with a reason. */
export const SECTION_FILES_GIVEN_UP: QueueSpec = { name: 'section-file-given-up', retryLimit: 3, retryDelaySeconds: 5, expireInSeconds: 60 };

/** Sections of more submissions than this get their ZIP and summary from a job, unless configured otherwise. */
export const BIG_SECTION = 200;

/** How long a drawn file stays downloadable: a working day, then the cleanup deletes it. */
const KEEP_HOURS = 24;
// The progress is written at most this often (a row update per sheet would be a write per sheet).
const PROGRESS_EVERY = 25;
const GIVEN_UP = 'the file could not be drawn after several tries; asking for the download again starts anew';

/**
 * The ZIP and summary of a section larger than the configured size, drawn by a job any process may
 * work and stored in the database (the place every process shares), so that the request answers at
 * once with a poll address, and any process answers the poll and streams the finished file.
 */
export class SectionFiles {
  constructor(
    private readonly grader: Grader,
    private readonly queue: JobQueue,
    /** Sections of more submissions than this are drawn by a job. */
    readonly bigSection: number,
  ) {}

  /** Whether the section's documents are drawn by a job rather than in the request. */
  async isBig(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<boolean> {
    return (await latestSubmissionIds(db, assignmentId, sectionId)).length > this.bigSection;
  }

  /** Records the file and queues its job in one transaction: neither exists without the other. */
  async request(db: Kysely<Database>, sectionId: number, assignmentId: number, document: SectionDocument): Promise<SectionFileRow> {
    return db.transaction().execute(async (trx) => {
      const total = document === 'feedback.zip' ? (await latestSubmissionIds(trx, assignmentId, sectionId)).length : 1;
      const row = await createSectionFile(trx, { id: randomUUID(), sectionId, assignmentId, document, total, keepHours: KEEP_HOURS });
      await this.queue.send(trx, SECTION_FILES.name, [{ fileId: row.fileId } satisfies SectionFileJob]);
      return row;
    });
  }

  /** Draws the file and stores it, unless it is stored already (or expired away). */
  async draw(db: Kysely<Database>, { fileId }: SectionFileJob): Promise<void> {
    const file = await sectionFileToDraw(db, fileId);
    if (!file) return;
    if (file.document === 'summary.pdf') {
      const summary = await sectionSummaryPdf(db, this.grader, file.sectionId, file.assignmentId);
      if (!summary) return failSectionFile(db, fileId, 'no checked submissions in this section');
      return finishSectionFile(db, fileId, { ...summary.name, content: summary.pdf });
    }
    let written = Promise.resolve();
    const { name, zip } = await sectionFeedbackZip(db, this.grader, file.sectionId, file.assignmentId, (count) => {
      if (count % PROGRESS_EVERY === 0) written = written.then(() => countSectionFileDone(db, fileId, count));
    });
    const content = await buffer(zip);
    await written;
    await finishSectionFile(db, fileId, { ...name, content });
  }

  giveUp(db: Kysely<Database>, { fileId }: SectionFileJob): Promise<void> {
    return failSectionFile(db, fileId, GIVEN_UP);
  }
}
