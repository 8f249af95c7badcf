import { createRemoteJWKSet, type JWTVerifyGetKey } from 'jose';

/**
 * Each platform's key set, fetched from its JWKS URL and cached by jose (refetched when a token names
 * a kid it has not seen, at most once a second: a platform's key rotation is picked up at once).
 */
const keySets = new Map<string, JWTVerifyGetKey>();

export function platformKeys(jwksUrl: string): JWTVerifyGetKey {
  let keys = keySets.get(jwksUrl);
  if (!keys) {
    keys = createRemoteJWKSet(new URL(jwksUrl), { timeoutDuration: 5000, cooldownDuration: 1000, cacheMaxAge: 600_000 });
    keySets.set(jwksUrl, keys);
  }
  return keys;
}
