import type { FastifyRequest } from 'fastify';
import type { Config } from '../config.ts';
import { ApiError } from '../errors.ts';
import type { Store } from '../store/connection.ts';
import { sessionCaller } from '../store/sessions.ts';
import { findCaller } from '../store/tokens.ts';
import type { Caller } from './access.ts';
import { sameSecret } from './same-secret.ts';
import { csrfMatches, readSessionCookie } from './session-cookie.ts';

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The admin or staff token of `Authorization: Bearer`, if the request carries one. */
export async function tokenCaller(token: string, store: Store, config: Config): Promise<Caller | undefined> {
  if (config.adminToken && sameSecret(token, config.adminToken)) return { kind: 'admin' };
  return findCaller(store.db, token);
}

/**
 * Who sent a request: a bearer token (scripts, the command line) or the workspace's session cookie.
 * Under a cookie, a change needs the page's `x-csrf-token` as well, which another site cannot know.
 */
export async function callerOf(request: FastifyRequest, store: Store, config: Config): Promise<Caller> {
  const header = request.headers.authorization;
  const token = header?.startsWith('Bearer ') ? header.slice(7).trim() : undefined;
  if (token) {
    const caller = await tokenCaller(token, store, config);
    if (!caller) throw new ApiError('unauthenticated', 'the API token is not valid');
    return caller;
  }
  const session = readSessionCookie(request);
  if (!session) throw new ApiError('unauthenticated');
  const caller = await sessionCaller(store.db, session);
  if (!caller) throw new ApiError('unauthenticated', 'the session has ended; sign in again');
  if (!READS.has(request.method) && !csrfMatches(session, request.headers['x-csrf-token'])) {
    throw new ApiError('forbidden', 'a change made with a session cookie needs the x-csrf-token header of the page');
  }
  return caller;
}
