import { z } from 'zod';
import { Enrolment } from './rosters.ts';

/**
 * Grade passback (LTI AGS) for one student: `waiting` (queued, or to be tried again after `reason`),
 * `sent` (the platform took the score), or `failed` (given up or refused, with `reason`); `at` is when
 * it was sent, or else queued.
 */
export const GradeSent = z.object({ state: z.enum(['waiting', 'sent', 'failed']), reason: z.string().nullable(), at: z.date() });

/** How many failed grade sends wait again after a TA's "send again". */
export const SendsRetried = z.object({ waiting: z.number() });

/** One roster student's latest result for an assignment, or their not having submitted. */
export const ResultRow = z.object({
  studentId: z.string(),
  /** Null for a roster student who has not submitted. */
  submissionId: z.number().nullable(),
  version: z.number().nullable(),
  /** When that version was stored; null for a roster student who has not submitted. */
  submittedAt: z.date().nullable(),
  /** Who sent it: `staff` (an upload for the section) or `student` (through their own door); null when nothing was submitted. */
  source: z.enum(['staff', 'student']).nullable(),
  /** Stored after the section's deadline (staff uploads are never late). */
  late: z.boolean(),
  /** Late under the hold policy and not yet accepted: a release leaves it out until a TA accepts it. */
  held: z.boolean(),
  /** When the student first opened the release they are shown now; null while they have not (or nothing was released). */
  feedbackFirstReadAt: z.date().nullable(),
  /** `checked`, `rejected`, `not-submitted`, or `withdrawn` (score kept when they submitted); null while a result is missing. */
  status: z.string().nullable(),
  /** On the roster: `enrolled` or `withdrawn` (removed students are left out). */
  enrolment: Enrolment,
  score: z.number().nullable(),
  maxScore: z.number().nullable(),
  /** Likely causes that cost points, one per cause as the feedback sheet groups findings (a slip repeated in several values counts once). */
  errors: z.number(),
  /** Causes of warnings that cost nothing, one per cause. */
  warnings: z.number(),
  /** Notes, values that follow from the student's own earlier numbers at no cost among them. */
  infos: z.number(),
  codes: z.array(z.string()),
  /** Something was released to the student (of this version or an earlier one): they see `releasedScore` until a TA releases again. */
  released: z.boolean(),
  /** The score the student was shown; null when nothing was released. */
  releasedScore: z.number().nullable(),
  /** The version released: this row's or an earlier one; null when nothing was released. */
  releasedVersion: z.number().nullable(),
  /** Released, and the latest result (a regrade, an override, a new version) would show the student something else: `score` beside `releasedScore`. */
  changedSinceRelease: z.boolean(),
  /** Where sending the released score to the student's learning platform stands; null for a student no platform knows, or nothing sent yet. */
  gradeSent: GradeSent.nullable(),
});
export type ResultRow = z.infer<typeof ResultRow>;

/** How many results a release made visible to students, and how many latest versions it left out as held late work. */
export const Released = z.object({ released: z.number(), held: z.number() });
export type Released = z.infer<typeof Released>;
