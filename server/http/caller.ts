import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { Config } from '../config.ts';
import { ApiError } from '../errors.ts';
import type { Store } from '../store/connection.ts';
import { sessionCaller } from '../store/sessions.ts';
import { STUDENT_SESSION_PREFIX, studentSessionCaller } from '../store/student-access.ts';
import { findCaller } from '../store/tokens.ts';
import type { Caller, StaffSideCaller } from './access.ts';
import { sameSecret } from './same-secret.ts';
import { csrfMatches, readSessionCookie } from './session-cookie.ts';

declare module 'fastify' {
  interface FastifyRequest {
    /** Who sent the request; settled before anything else on every route but the public ones. */
    caller: Caller;
  }
}

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** `Authorization: Bearer <token>`; the scheme's name is case-insensitive (RFC 9110 section 11.1, RFC 6750). */
const BEARER = /^bearer +(\S+) *$/i;

/** The token of a request's `Authorization: Bearer`, if it carries one. */
export const bearerToken = (request: FastifyRequest): string | undefined => BEARER.exec(request.headers.authorization ?? '')?.[1];

/** The admin or staff token of `Authorization: Bearer`, if the request carries one. */
export async function tokenCaller(token: string, store: Store, config: Config): Promise<StaffSideCaller | undefined> {
  if (config.adminToken && sameSecret(token, config.adminToken)) return { kind: 'admin' };
  return findCaller(store.db, token);
}

/** The staff member or student behind a session cookie's value: a student's session is marked by its prefix. */
export function sessionOwner(store: Store, session: string): Promise<Caller | undefined> {
  return session.startsWith(STUDENT_SESSION_PREFIX) ? studentSessionCaller(store.db, session) : sessionCaller(store.db, session);
}

/**
 * Who sent a request: a bearer token (scripts, the command line) or a session cookie, a staff
 * member's or a student's. Under a cookie, a change needs the page's `x-csrf-token` as well, which
 * another site cannot know.
 */
export async function callerOf(request: FastifyRequest, store: Store, config: Config): Promise<Caller> {
  const token = bearerToken(request);
  if (token) {
    const caller = await tokenCaller(token, store, config);
    if (!caller) throw new ApiError('unauthenticated', 'the API token is not valid');
    return caller;
  }
  const session = readSessionCookie(request);
  if (!session) throw new ApiError('unauthenticated');
  const caller = await sessionOwner(store, session);
  if (!caller) throw new ApiError('unauthenticated', 'the session has ended; sign in again');
  if (!READS.has(request.method) && !csrfMatches(session, request.headers['x-csrf-token'])) {
    throw new ApiError('forbidden', 'a change made with a session cookie needs the x-csrf-token header of the page');
  }
  return caller;
}

/** preValidation hook: 401 (or 403 for a change without the page's CSRF token) before anything else is read. */
export async function identifyCaller(request: FastifyRequest): Promise<void> {
  request.caller = await callerOf(request, request.server.store, request.server.config);
}

/** `request.caller`, set by `identifyCaller` on the routes that need one. */
export const callerPlugin = fp(async (app: FastifyInstance) => {
  app.decorateRequest<Caller | null>('caller', null);
}, { name: 'rateproof-caller' });
