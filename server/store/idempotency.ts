import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

export async function findIdempotent(db: Kysely<Database>, staffId: number, key: string) {
  return db.selectFrom('idempotency_keys').select(['request_hash as requestHash', 'status_code as statusCode', 'body']).where('staff_id', '=', staffId).where('key', '=', key).executeTakeFirst();
}

export async function saveIdempotent(db: Kysely<Database>, staffId: number, key: string, requestHash: string, statusCode: number, body: unknown): Promise<void> {
  await db.insertInto('idempotency_keys').values({ staff_id: staffId, key, request_hash: requestHash, status_code: statusCode, body: JSON.stringify(body) }).execute();
}
