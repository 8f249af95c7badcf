import { randomBytes } from 'node:crypto';
import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';
import { hashToken, staffCaller, type StaffCaller } from './tokens.ts';

/** A new session's cookie value (stored only as its hash) and when it expires. */
export async function createSession(db: Kysely<Database>, staffId: number, hours: number): Promise<{ session: string; expiresAt: Date }> {
  const session = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + hours * 3600_000);
  await db.insertInto('sessions').values({ staff_id: staffId, session_hash: hashToken(session), expires_at: expiresAt }).execute();
  return { session, expiresAt };
}

/** The staff member behind a live session. */
export async function sessionCaller(db: Kysely<Database>, session: string): Promise<StaffCaller | undefined> {
  const row = await db
    .selectFrom('sessions')
    .innerJoin('staff', 'staff.id', 'sessions.staff_id')
    .select(['staff.id as staffId', 'staff.course_id as courseId', 'staff.role as role'])
    .where('sessions.session_hash', '=', hashToken(session))
    .where('sessions.expires_at', '>', sql<Date>`now()`)
    .executeTakeFirst();
  return row && staffCaller(db, row);
}

/** Ends a session (sign-out), and clears expired ones while at it. */
export async function endSession(db: Kysely<Database>, session: string): Promise<void> {
  await db
    .deleteFrom('sessions')
    .where((eb) => eb.or([eb('session_hash', '=', hashToken(session)), eb('expires_at', '<=', sql<Date>`now()`)]))
    .execute();
}

/** Deletes the sessions past their expiry; returns how many. */
export async function deleteExpiredSessions(db: Kysely<Database>): Promise<number> {
  const result = await db.deleteFrom('sessions').where('expires_at', '<=', sql<Date>`now()`).executeTakeFirst();
  return Number(result.numDeletedRows);
}
