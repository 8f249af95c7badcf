import { ApiError } from '../errors.ts';
import { defineRoute } from '../http/route-table.ts';
import { csrfTokenOf, SESSION_HOURS, sessionCookieHeader } from '../http/session-cookie.ts';
import { createStudentSession, studentOfCode } from '../store/student-access.ts';
import { Session } from '../../schemas/api/session.ts';
import { AccessCodeSignIn } from '../../schemas/api/students.ts';

/**
 * A student's sign-in with the access code an instructor gave them: the same HttpOnly cookie as
 * staff use, holding a student session. Tries per address are limited, and every code that opens
 * nothing (wrong, revoked, replaced, or a student no longer enrolled) gets one and the same answer.
 */
export const studentSessionRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/student/session',
    access: 'public',
    rateLimited: true,
    summary: "A student signs in with their access code: sets an HttpOnly session cookie for the student's own pages. Tries per address are limited (429)",
    schema: { body: AccessCodeSignIn, response: { 201: Session } },
    async handler(request, reply) {
      const student = await studentOfCode(request.db, request.body.code);
      if (!student) throw new ApiError('unauthenticated', 'the access code is not valid');
      const { session, expiresAt } = await createStudentSession(request.db, student.studentRowId, SESSION_HOURS);
      reply.header('set-cookie', sessionCookieHeader(request, session, SESSION_HOURS * 3600, request.server.config.secureCookie === 'always'));
      return reply.code(201).send({ expiresAt, csrfToken: csrfTokenOf(session) });
    },
  }),
];
