import { z } from 'zod';
import { Text } from '../../schemas/common.ts';

/** Shapes shared by several routes' schemas. */
export const IdParam = z.coerce.number().int().positive();
export const ErrorResponse = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});
export const Name = Text(200);
