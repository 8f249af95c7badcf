import { calculateJwkThumbprint, exportJWK, generateKeyPair } from 'jose';
import type { Kysely } from 'kysely';
import type { KeySet } from '../../schemas/api/lti.ts';
import type { Database } from '../store/database.ts';
import { addSigningKey, servedPublicKeys, signingKey } from '../store/lti-keys.ts';

/**
 * How long a retired key stays in our key set: longer than any token it signed lives (the assertions
 * of the grade service will live 5 minutes) plus the hour a platform may cache our key set for
 * (common practice, no source), so a rotation never breaks a token in flight.
 */
export const RETIRED_KEY_SECONDS = 2 * 3600;

/**
 * A new RS256 key pair made by jose (2048-bit RSA), named by its JWK thumbprint (RFC 7638); it signs
 * from now on, and the key it replaces stays served until `RETIRED_KEY_SECONDS` have passed.
 */
export async function rotateSigningKey(db: Kysely<Database>): Promise<{ kid: string; retired: string | null }> {
  const { publicKey, privateKey } = await generateKeyPair('RS256', { extractable: true, modulusLength: 2048 });
  const publicJwk = await exportJWK(publicKey);
  const kid = await calculateJwkThumbprint(publicJwk);
  const retired = await addSigningKey(db, { kid, publicJwk: { ...publicJwk, kid, alg: 'RS256', use: 'sig' }, privateJwk: { ...(await exportJWK(privateKey)), kid, alg: 'RS256' } });
  return { kid, retired: retired ?? null };
}

/** A signing key exists once a platform is registered: made here if none is yet. */
export async function ensureSigningKey(db: Kysely<Database>): Promise<void> {
  if (!(await signingKey(db))) await rotateSigningKey(db);
}

/** Our public key set (Security Framework 1.0, 6.3: the key set URL a platform reads our keys from). */
export async function toolKeySet(db: Kysely<Database>): Promise<KeySet> {
  return { keys: (await servedPublicKeys(db, RETIRED_KEY_SECONDS)) as KeySet['keys'] };
}
