import { createHash } from 'node:crypto';
import type { FastifyRequest } from 'fastify';
import { ApiError } from '../errors.ts';
import { sameSecret } from './same-secret.ts';

/** The workspace's session cookie: HttpOnly (no script reads it), SameSite=Strict, Secure over TLS. */
export const SESSION_COOKIE = 'rateproof_session';
export const SESSION_HOURS = 8;

/** The session cookie's value; a value that is not percent-encoding is no session (a 401 naming the cookie). */
export function readSessionCookie(request: FastifyRequest): string | undefined {
  const header = request.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === SESSION_COOKIE) {
      try {
        return decodeURIComponent(part.slice(eq + 1).trim());
      } catch {
        throw new ApiError('unauthenticated', 'the session cookie cannot be read; sign in again', [{ path: `cookie.${SESSION_COOKIE}`, message: 'not valid percent-encoding' }]);
      }
    }
  }
  return undefined;
}

/** Set-Cookie for a session; an empty value with Max-Age 0 clears it. Secure over TLS, or always when told. */
export function sessionCookieHeader(request: FastifyRequest, value: string, maxAgeSeconds: number, alwaysSecure = false): string {
  const secure = alwaysSecure || request.protocol === 'https' ? '; Secure' : '';
  return `${SESSION_COOKIE}=${encodeURIComponent(value)}; Path=/; HttpOnly; SameSite=Strict; Max-Age=${maxAgeSeconds}${secure}`;
}

/**
 * The token a page must send (header `x-csrf-token`) with every change made under a session cookie:
 * derived from the cookie's secret, so the server stores nothing more, and readable only by a page of
 * this origin (from `GET /v1/me`), never by another site, which cannot read the cookie or the answer.
 */
export function csrfTokenOf(session: string): string {
  return createHash('sha256').update(`csrf:${session}`).digest('base64url');
}

export function csrfMatches(session: string, sent: unknown): boolean {
  return typeof sent === 'string' && sameSecret(csrfTokenOf(session), sent);
}
