import { z } from 'zod';
import { StudentId } from '../common.ts';
import type { AsJson } from './as-json.ts';

/** At most this many students named in one request about access codes (a roster's own limit). */
const MAX_STUDENTS = 5000;

const StudentIds = z.array(StudentId).min(1, 'at least one student id').max(MAX_STUDENTS, 'at most 5,000 students in one request');

/** A student's sign-in: the access code as typed (case, dashes, spaces and the look-alikes O, I, L do not matter). */
export const AccessCodeSignIn = z.object({ code: z.string().trim().min(1, 'the code is empty').max(40, 'an access code has 12 characters') });
export type AccessCodeSignIn = z.infer<typeof AccessCodeSignIn>;

/** A section's enrolled student and when their live code was issued (null: none); the code itself is never shown again. */
export const AccessCodeState = z.object({ studentId: z.string(), displayName: z.string().nullable(), issuedAt: z.date().nullable() });
export type AccessCodeState = AsJson<z.infer<typeof AccessCodeState>>;

/** Whom to issue codes to: the students named, or every enrolled student of the section when none are. */
export const IssueAccessCodes = z.object({ studentIds: StudentIds.optional() });
export type IssueAccessCodes = z.infer<typeof IssueAccessCodes>;

/** Codes just issued, shown this once (for a printed list or a mail merge); only their hashes are kept. */
export const IssuedAccessCodes = z.object({
  codes: z.array(z.object({ studentId: z.string(), displayName: z.string().nullable(), code: z.string() })),
});
export type IssuedAccessCodes = z.infer<typeof IssuedAccessCodes>;

export const RevokeAccessCodes = z.object({ studentIds: StudentIds });
export type RevokeAccessCodes = z.infer<typeof RevokeAccessCodes>;

/** How many live codes were revoked; the students' sessions are ended as well. */
export const RevokedAccessCodes = z.object({ revoked: z.number() });
export type RevokedAccessCodes = z.infer<typeof RevokedAccessCodes>;
