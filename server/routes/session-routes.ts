import type { FastifyInstance } from 'fastify';
import { z } from 'zod';
import type { Config } from '../config.ts';
import { ApiError } from '../errors.ts';
import type { Store } from '../store/connection.ts';
import { createSession, endSession, sessionCaller } from '../store/sessions.ts';
import { tokenCaller } from './caller.ts';
import { Session, SessionState } from '../../schemas/api/session.ts';
import { csrfMatches, csrfTokenOf, readSessionCookie, SESSION_HOURS, sessionCookieHeader } from './session-cookie.ts';

const SignIn = z.object({ token: z.string().min(1, 'the token is empty').max(500) });

/**
 * The workspace's sign-in and sign-out: a staff token is exchanged once for an HttpOnly session
 * cookie, so the page never keeps the token. Outside the route table: signing in needs no caller.
 */
export function registerSessionRoutes(app: FastifyInstance, store: Store, config: Config): void {
  // The page asks this before anything else: a visitor who has not signed in is an expected state,
  // not an error, so it answers 200 (a 401 here would show in the browser's console on every visit).
  app.get('/v1/session', { schema: { summary: "Whether the request's session cookie is a live session: `{ signedIn }`, 200 either way", response: { 200: SessionState } } }, async (request) => {
    const session = readSessionCookie(request);
    return { signedIn: session !== undefined && (await sessionCaller(store.db, session)) !== undefined };
  });

  app.post('/v1/session', { schema: { summary: 'Sign in to the workspace with a staff token: sets an HttpOnly session cookie', body: SignIn, response: { 201: Session } } }, async (request, reply) => {
    const { token } = request.body as z.infer<typeof SignIn>;
    const caller = await tokenCaller(token.trim(), store, config);
    if (!caller) throw new ApiError('unauthenticated', 'the token is not valid');
    if (caller.kind === 'admin') throw new ApiError('forbidden', 'the workspace is for course staff; the admin token works with the API');
    const { session, expiresAt } = await createSession(store.db, caller.staffId, SESSION_HOURS);
    reply.header('set-cookie', sessionCookieHeader(request, session, SESSION_HOURS * 3600, config.secureCookie === 'always'));
    return reply.code(201).send({ expiresAt, csrfToken: csrfTokenOf(session) });
  });

  app.delete('/v1/session', { schema: { summary: 'Sign out: ends the session and clears its cookie' } }, async (request, reply) => {
    const session = readSessionCookie(request);
    if (session) {
      if (!csrfMatches(session, request.headers['x-csrf-token'])) throw new ApiError('forbidden', 'signing out needs the x-csrf-token header of the page');
      await endSession(store.db, session);
    }
    reply.header('set-cookie', sessionCookieHeader(request, '', 0, config.secureCookie === 'always'));
    return reply.code(204).send();
  });
}
