import type { JWK } from 'jose';
import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';

export interface StoredKey {
  kid: string;
  publicJwk: JWK;
  privateJwk: JWK;
}

/**
 * Stores a new signing key and retires the one that signed until now, in one statement each inside
 * the caller's transaction; returns the kid retired (undefined on the first key). The private key is
 * kept as JWK JSON in the database, not encrypted at rest (docs/lti.md says so).
 */
export async function addSigningKey(db: Kysely<Database>, key: StoredKey): Promise<string | undefined> {
  // Rotations take turns (this lock mode conflicts with itself, not with readers of the key set): a
  // second rotation at the same moment then retires the first's new key instead of meeting the
  // one-signing-key index with a 500.
  await sql`LOCK TABLE lti_keys IN SHARE ROW EXCLUSIVE MODE`.execute(db);
  const retired = await db.updateTable('lti_keys').set({ retired_at: sql<Date>`now()` }).where('retired_at', 'is', null).returning('kid').execute();
  await db.insertInto('lti_keys').values({ kid: key.kid, public_jwk: JSON.stringify(key.publicJwk), private_jwk: JSON.stringify(key.privateJwk) }).execute();
  return retired[0]?.kid;
}

/** The key that signs now: the one not retired. */
export async function signingKey(db: Kysely<Database>): Promise<StoredKey | undefined> {
  const row = await db.selectFrom('lti_keys').select(['kid', 'public_jwk', 'private_jwk']).where('retired_at', 'is', null).executeTakeFirst();
  return row && { kid: row.kid, publicJwk: JSON.parse(row.public_jwk) as JWK, privateJwk: JSON.parse(row.private_jwk) as JWK };
}

/** The public keys to serve: the signing key and those retired less than `keepRetiredSeconds` ago, newest first. */
export async function servedPublicKeys(db: Kysely<Database>, keepRetiredSeconds: number): Promise<JWK[]> {
  const rows = await db
    .selectFrom('lti_keys')
    .select('public_jwk')
    .where((eb) => eb.or([eb('retired_at', 'is', null), eb('retired_at', '>', sql<Date>`now() - make_interval(secs => ${keepRetiredSeconds})`)]))
    .orderBy('created_at', 'desc')
    .execute();
  return rows.map((r) => JSON.parse(r.public_jwk) as JWK);
}
