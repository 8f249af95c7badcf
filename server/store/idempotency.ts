import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';

/** The longest Idempotency-Key kept; a longer one is refused, never cut short. */
export const MAX_IDEMPOTENCY_KEY = 200;

/**
 * Holds one caller's key until the transaction ends: a second request with the same key waits here,
 * then finds the first one's answer and replays it instead of running again.
 */
export async function holdIdempotencyKey(db: Kysely<Database>, staffId: number, key: string): Promise<void> {
  await sql`select pg_advisory_xact_lock(${staffId}::int, hashtext(${key}))`.execute(db);
}

export async function findIdempotent(db: Kysely<Database>, staffId: number, key: string) {
  return db.selectFrom('idempotency_keys').select(['request_hash as requestHash', 'status_code as statusCode', 'body']).where('staff_id', '=', staffId).where('key', '=', key).executeTakeFirst();
}

export async function saveIdempotent(db: Kysely<Database>, staffId: number, key: string, requestHash: string, statusCode: number, body: unknown): Promise<void> {
  await db.insertInto('idempotency_keys').values({ staff_id: staffId, key, request_hash: requestHash, status_code: statusCode, body: JSON.stringify(body) }).execute();
}

/** Deletes the answers kept for keys older than `days`; returns how many. */
export async function deleteIdempotencyKeysOlderThan(db: Kysely<Database>, days: number): Promise<number> {
  const result = await db.deleteFrom('idempotency_keys').where('created_at', '<', sql<Date>`now() - make_interval(days => ${days})`).executeTakeFirst();
  return Number(result.numDeletedRows);
}
