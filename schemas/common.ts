import { z } from 'zod';

/**
 * Building blocks of the public contract shared by every experiment kind.
 * A reported number may be sent as a JSON number or as a numeric string: the string keeps the
 * digits the student wrote (0.0520 keeps its last zero), which the significant-figure check reads.
 */
export const NumberLike = z.union([
  z.number(),
  // Only a string can hold a number too large for a double ("1e999"); zod's number refuses Infinity itself.
  z
    .string()
    .regex(/^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$/, 'a number such as 0.0521 or 5.21e-2')
    .refine((v) => Number.isFinite(Number(v)), 'a finite number'),
]);
export type NumberLike = z.infer<typeof NumberLike>;

// zod's number refuses Infinity and NaN itself (JSON cannot carry them anyway).
export const FiniteNumber = z.number();

/**
 * Text that PostgreSQL can store: it refuses the NUL character in text and in JSON, and an unpaired
 * UTF-16 surrogate (which JSON can carry as an escape such as "\ud800") is not Unicode text at all.
 */
const UNPAIRED_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;
export const isStorableText = (text: string): boolean => !text.includes('\u0000') && !UNPAIRED_SURROGATE.test(text);
export const UNSTORABLE_TEXT = 'contains a NUL character or an unpaired surrogate, which cannot be stored';

/** Free text of at most `max` characters, trimmed, never empty, storable. */
export const Text = (max: number, emptyMessage?: string) => z.string().trim().min(1, emptyMessage).max(max).refine(isStorableText, UNSTORABLE_TEXT);

export const UnitText = Text(40, 'a unit such as min^-1 or M');

/** A value with the unit it is in, e.g. a catalyst concentration. */
export const Quantity = z.object({ value: FiniteNumber, unit: UnitText });
export type Quantity = z.infer<typeof Quantity>;

/** A value a student reports, with its uncertainty (the standard error unless stated) and unit. */
export const ReportedValue = z.object({
  value: NumberLike,
  uncertainty: NumberLike.optional(),
  // Checked by the grader, not here: an unknown unit is a finding, not a rejected submission.
  unit: z.string().max(40).refine(isStorableText, UNSTORABLE_TEXT),
});
export type ReportedValue = z.infer<typeof ReportedValue>;

/** Pseudonymous ids only; the pattern keeps names and free text out of ids. */
export const StudentId = z
  .string()
  .regex(/^[A-Za-z0-9][A-Za-z0-9._-]{0,63}$/, 'letters, digits, dot, underscore or hyphen, at most 64');

export const Tolerance = z
  .object({
    relative: z.number().nonnegative().optional(),
    absolute: z.number().nonnegative().optional(),
  })
  .refine((t) => t.relative !== undefined || t.absolute !== undefined, 'give relative, absolute or both');
export type Tolerance = z.infer<typeof Tolerance>;

export const FitModel = z.enum(['origin', 'intercept']);

/** A range of values the instructor expects for this experiment, in its own unit. */
export const Band = z
  .object({ min: FiniteNumber, max: FiniteNumber, unit: UnitText })
  .refine((b) => b.min < b.max, 'min must be below max');
export type Band = z.infer<typeof Band>;
