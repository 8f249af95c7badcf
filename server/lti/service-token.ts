import { randomUUID } from 'node:crypto';
import { importJWK, SignJWT } from 'jose';
import type { Kysely } from 'kysely';
import { z } from 'zod';
import { ApiError } from '../errors.ts';
import type { Database } from '../store/database.ts';
import { signingKey } from '../store/lti-keys.ts';

/** How long our client assertion lives, and how long before a token's expiry we stop using it (common practice, no source). */
const ASSERTION_SECONDS = 300;
const EARLY_SECONDS = 60;
/** How long a platform's service may take to answer (common practice, no source). */
const PLATFORM_TIMEOUT_MS = 10_000;

/** The platform a service token is asked of. */
export interface TokenPlatform {
  id: number;
  clientId: string;
  tokenUrl: string;
}

const TokenAnswer = z.object({ access_token: z.string().min(1), token_type: z.string().optional(), expires_in: z.number().positive().optional() });

/** Tokens kept per platform, token URL and scope set, until shortly before they expire. */
const cache = new Map<string, { token: string; until: number }>();

/**
 * A failure at one of the platform's services: a 502 naming the step, never a 500. `lasting` when
 * trying again unchanged would fail again (the platform refused what was sent), not when it was down.
 */
export class PlatformFailure extends ApiError {
  constructor(
    readonly step: string,
    readonly why: string,
    readonly lasting: boolean,
  ) {
    super('platform-unavailable', `the learning platform's ${step} failed (${why}); nothing was changed, so try again later`);
  }
}

export function platformFailed(step: string, why: string, lasting = false): PlatformFailure {
  return new PlatformFailure(step, why, lasting);
}

/** Whether a status refuses the request itself (a 4xx other than a timeout or too many requests), so that sending it again is no use. */
export const refusedStatus = (status: number): boolean => status >= 400 && status < 500 && status !== 408 && status !== 429;

/** A request to one of the platform's services: no answer, or an error status, is a failure naming the step. */
export async function askPlatform(step: string, url: string, init: RequestInit): Promise<Response> {
  let response: Response;
  try {
    response = await fetch(url, { ...init, signal: AbortSignal.timeout(PLATFORM_TIMEOUT_MS) });
  } catch {
    throw platformFailed(step, 'no answer');
  }
  if (!response.ok) throw platformFailed(step, `status ${response.status}`, refusedStatus(response.status));
  return response;
}

/** Forgets the tokens kept for a platform: one its service turned down (expired or revoked early). */
export function forgetServiceTokens(platformId: number): void {
  for (const key of cache.keys()) if (key.startsWith(`${platformId} `)) cache.delete(key);
}

/**
 * An access token for the platform's services (Security Framework 1.0, 4.1: the client credentials
 * grant with a JWT client assertion, RFC 7523): the assertion signed RS256 with our current key, its
 * kid in the header; iss and sub our client id, aud the token URL, iat, exp 5 minutes on, a random
 * jti. Kept per platform and scope set until a minute before it expires.
 */
export async function serviceToken(db: Kysely<Database>, platform: TokenPlatform, scopes: string[]): Promise<string> {
  const scope = [...new Set(scopes)].sort().join(' ');
  const key = `${platform.id} ${platform.tokenUrl} ${platform.clientId} ${scope}`;
  const kept = cache.get(key);
  if (kept && kept.until > Date.now()) return kept.token;
  const ours = await signingKey(db);
  if (!ours) throw new ApiError('conflict', 'no signing key yet: register a platform first');
  const now = Math.floor(Date.now() / 1000);
  const assertion = await new SignJWT({})
    .setProtectedHeader({ alg: 'RS256', kid: ours.kid, typ: 'JWT' })
    .setIssuer(platform.clientId)
    .setSubject(platform.clientId)
    .setAudience(platform.tokenUrl)
    .setIssuedAt(now)
    .setExpirationTime(now + ASSERTION_SECONDS)
    .setJti(randomUUID())
    .sign(await importJWK(ours.privateJwk, 'RS256'));
  const form = new URLSearchParams({
    grant_type: 'client_credentials',
    client_assertion_type: 'urn:ietf:params:oauth:client-assertion-type:jwt-bearer',
    client_assertion: assertion,
    scope,
  });
  const response = await askPlatform('token endpoint', platform.tokenUrl, { method: 'POST', body: form, headers: { accept: 'application/json' } });
  const answer = TokenAnswer.safeParse(await response.json().catch(() => undefined));
  if (!answer.success) throw platformFailed('token endpoint', 'not a token answer');
  // RFC 6749, 5.1: expires_in is recommended, not required; without it the token is used once.
  const lives = answer.data.expires_in ?? 0;
  if (lives > EARLY_SECONDS) cache.set(key, { token: answer.data.access_token, until: Date.now() + (lives - EARLY_SECONDS) * 1000 });
  return answer.data.access_token;
}
