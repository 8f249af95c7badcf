import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';
import { hashToken } from './tokens.ts';

/** A login's state, stored as its hash with the nonce sent beside it; single use, short-lived. */
export async function storeLoginState(db: Kysely<Database>, state: string, nonce: string, platformId: number, seconds: number): Promise<void> {
  // Old states are cleared as new ones come: a used or expired state is worth nothing after a day.
  await db.deleteFrom('lti_login_states').where('expires_at', '<', sql<Date>`now() - interval '1 day'`).execute();
  await db
    .insertInto('lti_login_states')
    .values({ state_hash: hashToken(state), nonce, platform_id: platformId, expires_at: sql<Date>`now() + make_interval(secs => ${seconds})` })
    .execute();
}

export type StateUse = { outcome: 'unknown' } | { outcome: 'used' } | { outcome: 'expired' } | { outcome: 'fresh'; nonce: string; platformId: number };

/**
 * Uses a login's state up: the first use of a live state finds it fresh (and marks it used, in one
 * statement, so two posts of it cannot both pass); any later use finds it used, its nonce seen.
 */
export async function useLoginState(db: Kysely<Database>, state: string): Promise<StateUse> {
  const hash = hashToken(state);
  const taken = await db
    .updateTable('lti_login_states')
    .set({ used_at: sql<Date>`now()` })
    .where('state_hash', '=', hash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', sql<Date>`now()`)
    .returning(['nonce', 'platform_id'])
    .executeTakeFirst();
  if (taken) return { outcome: 'fresh', nonce: taken.nonce, platformId: taken.platform_id };
  const row = await db.selectFrom('lti_login_states').select(['used_at']).where('state_hash', '=', hash).executeTakeFirst();
  if (!row) return { outcome: 'unknown' };
  return row.used_at ? { outcome: 'used' } : { outcome: 'expired' };
}

/** A one-time ticket for a verified launch's person, stored as its hash. */
export async function storeTicket(db: Kysely<Database>, ticket: string, who: { studentRowId: number } | { staffId: number }, seconds: number): Promise<void> {
  await db.deleteFrom('lti_tickets').where('expires_at', '<', sql<Date>`now()`).execute();
  await db
    .insertInto('lti_tickets')
    .values({
      ticket_hash: hashToken(ticket),
      student_row_id: 'studentRowId' in who ? who.studentRowId : null,
      staff_id: 'staffId' in who ? who.staffId : null,
      expires_at: sql<Date>`now() + make_interval(secs => ${seconds})`,
    })
    .execute();
}

/** The person of a live ticket, taking the ticket (deleted in the same statement: single use). */
export async function takeTicket(db: Kysely<Database>, ticket: string): Promise<{ studentRowId: number } | { staffId: number } | undefined> {
  const row = await db
    .deleteFrom('lti_tickets')
    .where('ticket_hash', '=', hashToken(ticket))
    .where('expires_at', '>', sql<Date>`now()`)
    .returning(['student_row_id', 'staff_id'])
    .executeTakeFirst();
  if (!row) return undefined;
  return row.student_row_id !== null ? { studentRowId: row.student_row_id } : { staffId: row.staff_id! };
}
