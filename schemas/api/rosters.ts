import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/** A roster student's enrolment: never deleted, only withdrawn or removed. */
export const Enrolment = z.enum(['enrolled', 'withdrawn', 'removed']);
export type Enrolment = z.infer<typeof Enrolment>;

export const RosterStudent = z.object({
  studentId: z.string(),
  displayName: z.string().nullable(),
  status: Enrolment,
  /** Every change of enrolment: to what, by whom (null for the admin), when. */
  history: z.array(z.object({ status: Enrolment, by: z.string().nullable(), at: z.date() })),
});
export type RosterStudent = AsJson<z.infer<typeof RosterStudent>>;

export const RosterAdded = z.object({
  /** Students new to the roster. */
  added: z.number(),
  /** Students withdrawn or removed before, enrolled again. */
  reenrolled: z.number(),
  /** Students listed who were already enrolled: nothing changed for them but a display name given. */
  alreadyEnrolled: z.number(),
});
export type RosterAdded = z.infer<typeof RosterAdded>;
