import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/** A submission a batch stored, with its grade. */
export const StoredSubmission = z.object({
  studentId: z.string(),
  submissionId: z.number(),
  version: z.number(),
  status: z.string(),
  score: z.number().nullable(),
  maxScore: z.number(),
});

/** A submission of a batch refused, by place in the files (`submission 2, line 14`), field and reason. */
export const BatchRejection = z.object({ at: z.string(), studentId: z.string().nullable(), path: z.string(), message: z.string() });
export type BatchRejection = z.infer<typeof BatchRejection>;

/** A batch stored: what was stored and what was left out. */
export const BatchStored = z.object({ stored: z.array(StoredSubmission), rejected: z.array(BatchRejection) });
export type BatchStored = z.infer<typeof BatchStored>;

/** A batch checked and not stored (a dry run): how many would be stored, and what would be refused. */
export const BatchChecked = z.object({ dryRun: z.literal(true), valid: z.number(), rejected: z.array(BatchRejection) });
export type BatchChecked = z.infer<typeof BatchChecked>;

/** A stored result: the check result's fields, and its id. */
export const ResultView = z.looseObject({ resultId: z.number(), score: z.number().nullable(), maxScore: z.number(), findings: z.array(z.unknown()) });
const Override = z.object({
  id: z.number(),
  submissionId: z.number(),
  findingId: z.string(),
  pointsBefore: z.number(),
  pointsAfter: z.number(),
  reason: z.string(),
  /** The reason is printed on the student's sheet (else it stays in the audit trail only). */
  reasonShown: z.boolean(),
  by: z.string(),
  at: z.date(),
});
const SignalChoice = z.object({ code: z.string(), path: z.string(), onSheet: z.boolean(), by: z.string(), at: z.date() });

/** One submission, its latest result as overridden, and what was released of it. */
export const SubmissionView = z.object({
  submissionId: z.number(),
  assignmentId: z.number(),
  studentId: z.string(),
  sectionId: z.number(),
  version: z.number(),
  submittedAt: z.date(),
  /** Who sent it: `staff` (an upload for the section) or `student` (through their own door). */
  source: z.enum(['staff', 'student']),
  /** Stored after the section's deadline; `held` while a late one waits for a TA to accept it (POST .../accept-late). */
  late: z.boolean(),
  held: z.boolean(),
  payload: z.unknown(),
  result: ResultView.nullable(),
  overrides: z.array(Override),
  /** Every choice to put a signal on the sheet or take it off, oldest first. */
  signalChoices: z.array(SignalChoice),
  /** What the student was shown, of this version or an earlier one (null: nothing released yet), and whether this version's latest result differs from it. */
  release: z.object({ at: z.date(), version: z.number(), score: z.number().nullable(), changedSinceRelease: z.boolean() }).nullable(),
});
export type SubmissionView = AsJson<z.infer<typeof SubmissionView>>;

/** One version of a student's submission, with its latest result as overridden. */
export const SubmissionVersion = z.object({ submissionId: z.number(), assignmentId: z.number(), version: z.number(), submittedAt: z.date(), result: ResultView.nullable() });
export type SubmissionVersion = AsJson<z.infer<typeof SubmissionVersion>>;
