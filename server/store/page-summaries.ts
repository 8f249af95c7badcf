import { z } from 'zod';

/**
 * What the results page shows of one stored result before any override or signal choice, kept in
 * `results.page_summary` when the result is stored (server/grading/page-summary.ts works it out), so the
 * page need not read and group every student's findings.
 */
export const PageSummary = z.object({
  score: z.number().nullable(),
  maxScore: z.number(),
  /** Likely causes that cost points, warnings and notes, counted one per cause as the sheet groups them. */
  errors: z.number().int(),
  warnings: z.number().int(),
  infos: z.number().int(),
  /** The codes found, each once, in the order first found. */
  codes: z.array(z.string()),
  /** What a student would notice of it, compared with the released result's to tell a change. */
  shown: z.string(),
});
export type PageSummary = z.infer<typeof PageSummary>;
