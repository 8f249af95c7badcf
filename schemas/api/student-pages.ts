import { z } from 'zod';
import { SubmissionDisplay } from '../display.ts';
import type { AsJson } from './as-json.ts';

/** One version the student submitted: when, and whether it came late (and is held for a TA to accept). */
export const OwnVersion = z.object({ version: z.number(), submittedAt: z.date(), late: z.boolean(), held: z.boolean() });

/** One assignment of the student's course as their page lists it. */
export const OwnAssignment = z.object({
  id: z.number(),
  title: z.string(),
  kind: z.string(),
  /** The section's deadline; null when none is set. */
  dueAt: z.date().nullable(),
  /** What late work meets: graded as usual (`grade`), graded with `points` off (`deduct`), or held for a TA to accept (`hold`). */
  late: z.object({ policy: z.enum(['grade', 'deduct', 'hold']), points: z.number() }),
  /** Every version they submitted, oldest first. */
  versions: z.array(OwnVersion),
  /** The feedback released to them (of which version, when), and when they first opened it; null before any release. */
  feedback: z.object({ version: z.number(), releasedAt: z.date(), firstReadAt: z.date().nullable() }).nullable(),
});

/** The signed-in student, their course and section, the page's CSRF token and their assignments. */
export const StudentMe = z.object({
  studentId: z.string(),
  displayName: z.string().nullable(),
  course: z.object({ id: z.number(), name: z.string() }),
  section: z.object({ id: z.number(), name: z.string() }),
  /** Send as `x-csrf-token` with every change made under the session cookie. */
  csrfToken: z.string(),
  assignments: z.array(OwnAssignment),
});
export type StudentMe = AsJson<z.infer<typeof StudentMe>>;

/**
 * A student's submission as stored: its version, whether it came late (and is held), and what the
 * form check read of it, in plain lines. Never a score or a finding: those wait for a release.
 */
export const OwnSubmissionStored = z.object({
  version: z.number(),
  submittedAt: z.date(),
  late: z.boolean(),
  held: z.boolean(),
  form: z.object({ lines: z.array(z.string()) }),
});
export type OwnSubmissionStored = AsJson<z.infer<typeof OwnSubmissionStored>>;

/**
 * The feedback released to the student: the version and result released (the TAs' overrides and
 * signal choices as they stood at the release), as the staff's page of the submission draws it.
 */
export const OwnFeedback = z.object({
  version: z.number(),
  releasedAt: z.date(),
  /** Null when the released result could not be checked (its problems are then in `display.rejected`). */
  score: z.number().nullable(),
  maxScore: z.number().nullable(),
  display: SubmissionDisplay,
});
export type OwnFeedback = AsJson<z.infer<typeof OwnFeedback>>;
