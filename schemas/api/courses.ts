import { z } from 'zod';

export const Staff = z.object({ id: z.number(), courseId: z.number(), handle: z.string(), role: z.enum(['instructor', 'ta']), sectionIds: z.array(z.number()) });

/** A staff member as the course's staff list shows them: with how many live tokens they hold. */
export const StaffMember = Staff.extend({ liveTokens: z.number() });
export type StaffMember = z.infer<typeof StaffMember>;

/** A new token, shown this once. */
export const IssuedToken = z.object({ token: z.string() });
export type IssuedToken = z.infer<typeof IssuedToken>;

export const RevokedTokens = z.object({ revoked: z.number() });
export type RevokedTokens = z.infer<typeof RevokedTokens>;
