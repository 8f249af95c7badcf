import { z } from 'zod';

/**
 * What the checker returns for one submission; the same for every experiment kind. A kind names its
 * own stages and finding codes (its schema module lists them); these codes mean the same in every kind.
 */
export const Severity = z.enum(['info', 'warning', 'error']);

export const sharedFindingCodes = [
  'sign-flipped',
  'log-base',
  'decimal-shift',
  'carried-forward',
  'implausible',
  'sig-figs',
  'unit-unrecognised',
  'missing-value',
  'unexplained',
  // Not a slip: how the refit had to depart from the settings (and why), for the TA to see.
  'refit-note',
  // Not of the work either: stored after the deadline, under a late policy that takes points off.
  'late-submission',
] as const;
export type SharedFindingCode = (typeof sharedFindingCodes)[number];

/** The stage every kind ends with: findings on how the work was handed in rather than on its numbers. */
export const HANDING_IN_STAGE = { id: 'handing-in', title: 'Handing in' } as const;

/** Codes and stage names are lower-case words joined by hyphens. */
export const Code = z.string().regex(/^[a-z][a-z0-9-]*$/);

export const transcriptionDetails = [
  'transposed-digits',
  'dropped-digit',
  'extra-digit',
  'decimal-point',
  'sign-lost',
  'row-shift',
  'missing-row',
  'extra-row',
  'other',
] as const;

export const Finding = z.object({
  /** Stable within a result: `code@path`, so a TA's override can name it across regrades. */
  id: z.string(),
  /** One of the kind's finding codes (the shared ones among them). */
  code: Code,
  /** Further codes when more than one cause explains the value at once (e.g. sign and log base). */
  alsoCodes: z.array(Code).optional(),
  /** For transcription: which slip; for wrong-infinity: which value was used. */
  detail: z.string().optional(),
  /** One of the kind's stages, in which the sheet groups findings. */
  stage: Code,
  /** Where in the submission, e.g. `runs[2].reported.k`. */
  path: z.string(),
  reported: z.number().nullable().optional(),
  expected: z.number().nullable().optional(),
  unit: z.string().optional(),
  severity: Severity,
  pointsLost: z.number().nonnegative(),
  /** The rubric item the points come from. */
  rubricItem: z.string().optional(),
  /** The instance of the item, e.g. `k@runs[2]` (an item counted per run); its points are capped per instance. */
  itemKey: z.string().optional(),
  /** Plain words, quoting the numbers, saying what to check. A likely cause, never a verdict. */
  message: z.string(),
});
export type Finding = z.infer<typeof Finding>;

export const Estimate = z.object({
  value: z.number(),
  standardError: z.number(),
  ci95: z.tuple([z.number(), z.number()]),
  unit: z.string(),
});

/** A refit value in the instructor's unit, and in the unit the student declared where that differs. */
export const RefitValue = z.object({
  instructor: Estimate,
  declared: Estimate.optional(),
});

export const Rejection = z.object({ path: z.string(), message: z.string() });
export type Rejection = z.infer<typeof Rejection>;

/** One rubric item in the maximum: how many times it counts for this submission, and what each is worth. */
export const RubricCount = z.object({ item: z.string(), count: z.number().int().nonnegative(), each: z.number().nonnegative() });
export type RubricCount = z.infer<typeof RubricCount>;

/**
 * What the numbers say about how the experiment was run, for the TA's review: never points lost, never
 * on a student's sheet unless a TA puts it there.
 */
export const Signal = z.object({
  /** One of the kind's signal codes (its checker lists them), so a kind adds a signal in its own folder. */
  code: Code,
  path: z.string(),
  /** Neutral words with the evidence. */
  message: z.string(),
  evidence: z.record(z.string(), z.number()),
  /** Set only by a TA's choice (never by the checker): shown on the student's feedback sheet. */
  onSheet: z.boolean().optional(),
});
export type Signal = z.infer<typeof Signal>;

export const CheckResult = z.object({
  studentId: z.string().nullable(),
  status: z.enum(['checked', 'rejected']),
  score: z.number().nullable(),
  maxScore: z.number(),
  /** What maxScore is made of; an item that cannot be checked for this submission is not in it. */
  items: z.array(RubricCount).optional(),
  /** Our own values for every quantity; the shape is the experiment kind's. */
  refit: z.record(z.string(), z.unknown()).nullable(),
  findings: z.array(Finding),
  /** Signals about the measurement, for review (absent in results stored before they were kept). */
  signals: z.array(Signal).optional(),
  rejected: z.array(Rejection).optional(),
  engineVersion: z.string(),
});
export type CheckResult = z.infer<typeof CheckResult>;
