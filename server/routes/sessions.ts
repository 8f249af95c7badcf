import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { sessionOwner, tokenCaller } from '../http/caller.ts';
import { defineRoute } from '../http/route-table.ts';
import { csrfMatches, csrfTokenOf, readSessionCookie, SESSION_HOURS, sessionCookieHeader } from '../http/session-cookie.ts';
import { createSession, endSession } from '../store/sessions.ts';
import { endStudentSession, STUDENT_SESSION_PREFIX } from '../store/student-access.ts';
import { Session, SessionState } from '../../schemas/api/session.ts';

const SignIn = z.object({ token: z.string().min(1, 'the token is empty').max(500) });

/**
 * The workspace's sign-in and sign-out: a staff token is exchanged once for an HttpOnly session
 * cookie, so the page never keeps the token. Public: signing in needs no caller.
 */
export const sessionRoutes = [
  // The page asks this before anything else: a visitor who has not signed in is an expected state,
  // not an error, so it answers 200 (a 401 here would show in the browser's console on every visit).
  defineRoute({
    method: 'GET',
    url: '/v1/session',
    access: 'public',
    summary: "Whether the request's session cookie is a live session, and a staff member's or a student's: `{ signedIn, as }`, 200 either way",
    schema: { response: { 200: SessionState } },
    async handler(request) {
      const session = readSessionCookie(request);
      const owner = session === undefined ? undefined : await sessionOwner(request.server.store, session);
      return { signedIn: owner !== undefined, as: owner === undefined ? null : owner.kind === 'student' ? ('student' as const) : ('staff' as const) };
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/session',
    access: 'public',
    summary: 'Sign in to the workspace with a staff token: sets an HttpOnly session cookie',
    schema: { body: SignIn, response: { 201: Session } },
    async handler(request, reply) {
      const { config, store } = request.server;
      const caller = await tokenCaller(request.body.token.trim(), store, config);
      if (!caller) throw new ApiError('unauthenticated', 'the token is not valid');
      if (caller.kind === 'admin') throw new ApiError('forbidden', 'the workspace is for course staff; the admin token works with the API');
      const { session, expiresAt } = await createSession(request.db, caller.staffId, SESSION_HOURS);
      reply.header('set-cookie', sessionCookieHeader(request, session, SESSION_HOURS * 3600, config.secureCookie === 'always'));
      return reply.code(201).send({ expiresAt, csrfToken: csrfTokenOf(session) });
    },
  }),
  defineRoute({
    method: 'DELETE',
    url: '/v1/session',
    access: 'public',
    summary: "Sign out: ends the session (a staff member's or a student's) and clears its cookie",
    schema: { response: {} },
    async handler(request, reply) {
      const session = readSessionCookie(request);
      if (session) {
        if (!csrfMatches(session, request.headers['x-csrf-token'])) throw new ApiError('forbidden', 'signing out needs the x-csrf-token header of the page');
        await (session.startsWith(STUDENT_SESSION_PREFIX) ? endStudentSession(request.db, session) : endSession(request.db, session));
      }
      reply.header('set-cookie', sessionCookieHeader(request, '', 0, request.server.config.secureCookie === 'always'));
      return reply.code(204).send();
    },
  }),
];
