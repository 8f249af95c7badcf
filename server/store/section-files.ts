import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';

export type SectionDocument = 'feedback.zip' | 'summary.pdf';

/** A section file's progress as stored: what any process answers to a poll. */
export interface SectionFileRow {
  fileId: string;
  sectionId: number;
  assignmentId: number;
  document: SectionDocument;
  total: number;
  done: number;
  status: 'running' | 'finished' | 'failed';
  error: string | null;
  startedAt: Date;
  finishedAt: Date | null;
  expiresAt: Date;
}

const columns = [
  'id as fileId',
  'section_id as sectionId',
  'assignment_id as assignmentId',
  'document',
  'total',
  'done',
  'status',
  'error',
  'started_at as startedAt',
  'finished_at as finishedAt',
  'expires_at as expiresAt',
] as const;

/** Records a file to draw, expiring `keepHours` from now; in the caller's transaction (with its job). */
export async function createSectionFile(
  db: Kysely<Database>,
  file: { id: string; sectionId: number; assignmentId: number; document: SectionDocument; total: number; keepHours: number },
): Promise<SectionFileRow> {
  return db
    .insertInto('section_files')
    .values({ id: file.id, section_id: file.sectionId, assignment_id: file.assignmentId, document: file.document, total: file.total, expires_at: sql<Date>`now() + make_interval(hours => ${file.keepHours})` })
    .returning(columns)
    .executeTakeFirstOrThrow();
}

/** A file's progress, only within its section and assignment (else undefined, as for one never made). */
export async function getSectionFile(db: Kysely<Database>, fileId: string, sectionId: number, assignmentId: number): Promise<SectionFileRow | undefined> {
  return db.selectFrom('section_files').select(columns).where('id', '=', fileId).where('section_id', '=', sectionId).where('assignment_id', '=', assignmentId).executeTakeFirst();
}

/** A finished file's name and bytes. */
export async function sectionFileContent(db: Kysely<Database>, fileId: string) {
  return db
    .selectFrom('section_files')
    .select(['name_ascii as ascii', 'name_unicode as unicode', 'content'])
    .where('id', '=', fileId)
    .where('status', '=', 'finished')
    .executeTakeFirst();
}

/** Counts drawn entries; a file no longer running is left as it is. */
export async function countSectionFileDone(db: Kysely<Database>, fileId: string, done: number): Promise<void> {
  await db.updateTable('section_files').set({ done }).where('id', '=', fileId).where('status', '=', 'running').execute();
}

/** Stores the drawn file once: a second try of the same job (its first process presumed dead) changes nothing after the first stored it. */
export async function finishSectionFile(db: Kysely<Database>, fileId: string, file: { ascii: string; unicode: string; content: Buffer }): Promise<void> {
  await db
    .updateTable('section_files')
    .set({ status: 'finished', done: sql<number>`total`, name_ascii: file.ascii, name_unicode: file.unicode, content: file.content, finished_at: sql<Date>`now()` })
    .where('id', '=', fileId)
    .where('status', '=', 'running')
    .execute();
}

export async function failSectionFile(db: Kysely<Database>, fileId: string, error: string): Promise<void> {
  await db.updateTable('section_files').set({ status: 'failed', error, finished_at: sql<Date>`now()` }).where('id', '=', fileId).where('status', '=', 'running').execute();
}

/** What file to draw, while it is still to draw (undefined once finished, failed or expired away). */
export async function sectionFileToDraw(db: Kysely<Database>, fileId: string) {
  return db.selectFrom('section_files').select(['section_id as sectionId', 'assignment_id as assignmentId', 'document']).where('id', '=', fileId).where('status', '=', 'running').executeTakeFirst();
}

/** Deletes files past their expiry, with their bytes. */
export async function deleteExpiredSectionFiles(db: Kysely<Database>): Promise<number> {
  const result = await db.deleteFrom('section_files').where('expires_at', '<', sql<Date>`now()`).executeTakeFirst();
  return Number(result.numDeletedRows);
}
