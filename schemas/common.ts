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

/** Schemas with a fast path, and the exact schema each stands for in JSON Schema. */
const exactOf = new Map<z.ZodType, z.ZodType>();

/**
 * `exact`, read faster: a value `plain` accepts (a check that passes only values `exact` accepts
 * unchanged) is taken as it is; any other is parsed by `exact`, so that a refused value gets its
 * exact messages. Long arrays of small tuples cost zod a copy of every element, and every batch
 * reads thousands of them.
 */
export function withFastPath<T extends z.ZodType>(exact: T, plain: (value: unknown) => boolean): z.ZodType<z.output<T>, z.input<T>> {
  const fast = z.unknown().transform((value, ctx) => {
    if (plain(value)) return value as z.output<T>;
    const parsed = exact.safeParse(value);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message, input: value });
    return z.NEVER;
  }) as unknown as z.ZodType<z.output<T>, z.input<T>>;
  exactOf.set(fast, exact);
  return fast;
}

/** For z.toJSONSchema's `override`: a fast-path schema is written as the exact schema it stands for. */
export function fastPathAsExact(ctx: { zodSchema: unknown; jsonSchema: Record<string, unknown> }, io: 'input' | 'output'): void {
  const exact = exactOf.get(ctx.zodSchema as z.ZodType);
  if (!exact) return;
  const { $schema: _$schema, ...json } = z.toJSONSchema(exact, { io }) as Record<string, unknown>;
  for (const key of Object.keys(ctx.jsonSchema)) delete ctx.jsonSchema[key];
  Object.assign(ctx.jsonSchema, json);
}

/**
 * Text that PostgreSQL can store: it refuses the NUL character in text and in JSON, and an unpaired
 * UTF-16 surrogate (which JSON can carry as an escape such as "\ud800") is not Unicode text at all.
 */
const UNPAIRED_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;
export const isStorableText = (text: string): boolean => {
  // Most text has no NUL and no surrogate at all: one pass over the code units decides it.
  let surrogates = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return false;
    if (c >= 0xd800 && c <= 0xdfff) surrogates = true;
  }
  return !surrogates || !UNPAIRED_SURROGATE.test(text);
};
export const UNSTORABLE_TEXT = 'contains a NUL character or an unpaired surrogate, which cannot be stored';

/** Free text of at most `max` characters, trimmed, never empty, storable. */
export const Text = (max: number, emptyMessage?: string) => z.string().trim().min(1, emptyMessage).max(max).refine(isStorableText, UNSTORABLE_TEXT);

export const UnitText = Text(40, 'a unit such as min^-1 or M');

/** A value with the unit it is in, e.g. a concentration. */
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

/**
 * What becomes of work stored after its deadline: graded as usual, graded less `points`, or held
 * until a TA accepts it. Under 'deduct' the points must be above zero, else it would be 'grade'.
 */
export const LatePolicy = z
  .object({
    policy: z.enum(['grade', 'deduct', 'hold']).default('grade'),
    points: z.number().nonnegative().max(1000).default(0),
  })
  .refine((late) => late.policy !== 'deduct' || late.points > 0, { path: ['points'], message: 'points must be above 0 when late work is graded with a deduction' });
export type LatePolicy = z.infer<typeof LatePolicy>;
export const LATE_POLICY_DEFAULT: LatePolicy = { policy: 'grade', points: 0 };
