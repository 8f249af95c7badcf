import { z } from 'zod';
import { Text } from '../../schemas/common.ts';
import { errorCatalogue, type ApiErrorCode } from '../errors.ts';

/**
 * An id in a URL, written as the database writes it: digits without a sign, a leading zero, a point
 * or an exponent, so that `1e0`, `01` and `1.0` are no id (and never open record 1).
 */
export const ID_PATTERN = /^[1-9][0-9]{0,14}$/;

/** The largest id the store's integer keys hold; a longer one names nothing. */
const MAX_ID = 2147483647;

/** The id a URL segment names, or undefined when it is not one. */
export function parseId(text: unknown): number | undefined {
  if (typeof text !== 'string' || !ID_PATTERN.test(text)) return undefined;
  const id = Number(text);
  return id <= MAX_ID ? id : undefined;
}

/** Shapes shared by several routes' schemas. */
export const IdParam = z
  .string()
  .regex(ID_PATTERN, 'an id: digits, without a leading zero')
  .transform((text, ctx) => parseId(text) ?? (ctx.addIssue({ code: 'custom', message: `at most ${MAX_ID}` }), z.NEVER));

const errorBody = (code: z.ZodType) =>
  z.object({
    error: z.object({
      code,
      message: z.string(),
      details: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    }),
  });

/** The error body at one HTTP status, its `code` an enum of the codes that answer with that status. */
export function errorResponseAt(status: number) {
  const codes = errorCatalogue.filter((e) => e.status === status).map((e) => e.code);
  return errorBody(z.enum(codes as [ApiErrorCode, ...ApiErrorCode[]]));
}
export const Name = Text(200);

