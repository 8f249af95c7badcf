import { z } from 'zod';
import type { AsJson } from './as-json.ts';

/** Whether the request's session cookie is a live session, and whose: a staff member's or a student's. */
export const SessionState = z.object({ signedIn: z.boolean(), as: z.enum(['staff', 'student']).nullable() });
export type SessionState = z.infer<typeof SessionState>;

/** A new session: when it ends, and the token the page sends with each change (header x-csrf-token). */
export const Session = z.object({ expiresAt: z.date(), csrfToken: z.string() });
export type Session = AsJson<z.infer<typeof Session>>;
