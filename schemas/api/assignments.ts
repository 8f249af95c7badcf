import { z } from 'zod';
import type { AsJson } from './as-json.ts';

export const Assignment = z.object({
  id: z.number(),
  courseId: z.number(),
  title: z.string(),
  kind: z.string(),
  /** The kind's stages, in order, as findings are grouped (titles with sub/superscript markup: k_{obs}). */
  stages: z.array(z.object({ id: z.string(), title: z.string() })),
  settings: z.unknown(),
  settingsVersion: z.number(),
  createdAt: z.date(),
});
export type Assignment = AsJson<z.infer<typeof Assignment>>;

/** How far a regrade is (kept in the database: every service process answers the same). */
export const RegradeProgressView = z.object({
  regradeId: z.string(),
  assignmentId: z.number(),
  sectionId: z.number().nullable(),
  total: z.number(),
  done: z.number(),
  status: z.enum(['running', 'finished', 'failed']),
  /** Why it stopped, when it failed; the results stored before stay. */
  error: z.string().nullable(),
  startedAt: z.date(),
  finishedAt: z.date().nullable(),
});
export type RegradeProgressView = AsJson<z.infer<typeof RegradeProgressView>>;

/** The assignment's regrade started last, or null when it has had none: a reloaded page follows it. */
export const LatestRegradeView = z.object({ regrade: RegradeProgressView.nullable() });
export type LatestRegradeView = AsJson<z.infer<typeof LatestRegradeView>>;
