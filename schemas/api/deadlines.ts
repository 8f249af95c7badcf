import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/** A new deadline: an ISO 8601 date-time with its offset (`2026-12-07T17:00:00+01:00`), or null to clear it. */
export const DeadlineChange = z.object({
  dueAt: z.iso
    .datetime({ offset: true, message: 'an ISO 8601 date-time with its time zone, such as 2026-12-07T17:00:00+01:00' })
    .transform((text) => new Date(text))
    .nullable(),
});

/** A section's deadline for an assignment: null when none is set (nothing submitted is then late). */
export const DeadlineView = z.object({
  dueAt: z.date().nullable(),
  /** Who set it and when; null when none is set. */
  setBy: z.string().nullable(),
  setAt: z.date().nullable(),
});
export type DeadlineView = AsJson<z.infer<typeof DeadlineView>>;

/** A late submission after a TA accepted it: no longer held, so the next release includes it. */
export const LateAccepted = z.object({
  submissionId: z.number(),
  late: z.boolean(),
  held: z.boolean(),
  acceptedBy: z.string().nullable(),
  acceptedAt: z.date().nullable(),
});
export type LateAccepted = AsJson<z.infer<typeof LateAccepted>>;
