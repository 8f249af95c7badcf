import { z } from 'zod';

/** Who is calling, and what they may open. */
export const Me = z.object({
  role: z.enum(['admin', 'instructor', 'ta']),
  staffId: z.number().optional(),
  handle: z.string().optional(),
  /** What the caller may open: the course, the sections they grade, its assignments. */
  courses: z.array(
    z.object({
      id: z.number(),
      name: z.string(),
      sections: z.array(z.object({ id: z.number(), name: z.string() })),
      assignments: z.array(z.object({ id: z.number(), title: z.string(), kind: z.string() })),
    }),
  ),
  /** Under a session cookie: the token the page sends with each change (header x-csrf-token). */
  csrfToken: z.string().optional(),
});
export type Me = z.infer<typeof Me>;
export type MyCourse = Me['courses'][number];
