import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/**
 * A large section's ZIP or summary being drawn by a job (kept in the database: every service process
 * answers the same). `download` is where the finished file is fetched, until it expires.
 */
export const SectionFileView = z.object({
  fileId: z.string(),
  sectionId: z.number(),
  assignmentId: z.number(),
  document: z.enum(['feedback.zip', 'summary.pdf']),
  /** Sheets drawn of the total (a summary counts as one). */
  total: z.number(),
  done: z.number(),
  status: z.enum(['running', 'finished', 'failed']),
  /** Why it stopped, when it failed. */
  error: z.string().nullable(),
  startedAt: z.date(),
  finishedAt: z.date().nullable(),
  /** After this the file is deleted; ask for the download again. */
  expiresAt: z.date(),
  /** Where the answer to this poll is asked again. */
  poll: z.string(),
  /** Where the finished file is fetched; null until it is finished. */
  download: z.string().nullable(),
});
export type SectionFileView = AsJson<z.infer<typeof SectionFileView>>;
