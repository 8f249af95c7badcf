import type { FastifyReply, FastifyRequest } from 'fastify';
import { z } from 'zod';
import { defineRoute } from '../http/route-table.ts';
import { SESSION_HOURS, sessionCookieHeader } from '../http/session-cookie.ts';
import { ApiError } from '../errors.ts';
import { IdParam } from '../http/schemas.ts';
import { deepLinkingResponse } from '../lti/deep-linking.ts';
import { completeLaunch, ofCourse, startLogin, type LaunchOutcome, type LoginFields } from '../lti/launch.ts';
import { choosePage, continuePage, notPlacedPage, PAGE_HEADERS, refusedPage, returnPage, returnPageHeaders } from '../lti/launch-pages.ts';
import { LaunchRefused } from '../lti/refusal.ts';
import { toolKeySet } from '../lti/tool-keys.ts';
import { getAssignment } from '../store/assignments.ts';
import { takeDeepLink } from '../store/lti-deep-links.ts';
import { takeTicket } from '../store/lti-launch-states.ts';
import { getPlatform } from '../store/lti-platforms.ts';
import { createSession } from '../store/sessions.ts';
import { createStudentSession } from '../store/student-access.ts';
import { HtmlPage, KeySet, LaunchPost, LoginInitiation, TicketPost } from '../../schemas/api/lti.ts';

const LAUNCH_PATH = '/v1/lti/launch';

/**
 * A refusal: a 401 with a page naming its reason code (HTML, not the API's error body: a browser
 * shows it), the code logged alone (no claim, no name, no subject id), and no session.
 */
function refuse(request: FastifyRequest, reply: FastifyReply, error: unknown): FastifyReply {
  if (!(error instanceof LaunchRefused)) throw error;
  request.log.warn({ ltiRefusal: error.code }, 'LTI message refused');
  return reply.code(401).headers(PAGE_HEADERS).type('text/html; charset=utf-8').send(refusedPage(error.code));
}

const html = (reply: FastifyReply, body: string, headers: Record<string, string> = PAGE_HEADERS) => reply.code(200).headers(headers).type('text/html; charset=utf-8').send(body);

/** A verified launch's page: on to this site, not placed yet, or the choice a deep link asks for. */
function launchPage(outcome: LaunchOutcome): string {
  if (outcome.kind === 'ticket') return continuePage(outcome.ticket);
  if (outcome.kind === 'choose') return choosePage(outcome.ticket, outcome);
  return notPlacedPage();
}

/** The instructor's choice for a deep link, form-posted from our own page with its ticket. */
const DeepLinkChoice = z.object({ ticket: z.string().min(1).max(200), assignmentId: IdParam, sectionId: IdParam });

/** Login initiation, by GET or by form POST alike (Security Framework 1.0, 5.1.1.1). */
async function login(request: FastifyRequest, reply: FastifyReply, fields: LoginFields) {
  try {
    const redirectUri = `${request.protocol}://${request.host}${LAUNCH_PATH}`;
    return reply.redirect(await startLogin(request.server.store.db, fields, redirectUri), 302);
  } catch (error) {
    return refuse(request, reply, error);
  }
}

const loginSummary = 'LTI 1.3 third-party initiated login: redirects to the platform with a fresh state and nonce; an unregistered issuer is refused';
const redirect = { 302: z.null().describe('to the platform’s authorisation endpoint') };

/**
 * The LTI 1.3 launch: our key set, the login a platform initiates, the launch it posts back, and the
 * same-site step that turns a verified launch into a session. Public: a platform's browser comes
 * with no session; what proves a launch is the platform's signature, checked here.
 */
export const ltiLaunchRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/lti/jwks',
    access: 'public',
    summary: "Rateproof's public key set (RS256): the signing key and those retired recently, for platforms to check our signatures",
    schema: { response: { 200: KeySet } },
    async handler({ server }) {
      return toolKeySet(server.store.db);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/lti/login',
    access: 'public',
    summary: loginSummary,
    schema: { querystring: LoginInitiation, response: { ...redirect } },
    async handler(request, reply) {
      return login(request, reply, request.query);
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/lti/login',
    access: 'public',
    summary: loginSummary,
    schema: { body: LoginInitiation, response: { ...redirect } },
    async handler(request, reply) {
      return login(request, reply, request.body);
    },
  }),
  defineRoute({
    method: 'POST',
    url: LAUNCH_PATH,
    access: 'public',
    summary:
      'LTI 1.3 launch (form post of id_token and state): verified, then answered with a page that continues to this site, where the session is made; refused with a reason code otherwise',
    schema: { body: LaunchPost, response: { 200: HtmlPage } },
    async handler(request, reply) {
      try {
        const outcome = await completeLaunch(request.server.store.db, request.body.id_token, request.body.state);
        request.log.info({ ltiLaunch: outcome.kind === 'ticket' ? outcome.as : outcome.kind }, 'LTI launch verified');
        return html(reply, launchPage(outcome));
      } catch (error) {
        return refuse(request, reply, error);
      }
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/lti/enter',
    access: 'public',
    summary: "A verified launch's same-site step: its one-time ticket becomes a session cookie (a student's or a staff member's), then on to the pages",
    schema: { body: TicketPost, response: { 303: z.null().describe('to the pages') } },
    async handler(request, reply) {
      try {
        if (!sameOrigin(request)) throw new LaunchRefused('ticket-cross-site');
        const db = request.server.store.db;
        const who = await takeTicket(db, request.body.ticket);
        if (!who) throw new LaunchRefused('ticket-unknown');
        const { session } = 'staffId' in who ? await createSession(db, who.staffId, SESSION_HOURS) : await createStudentSession(db, who.studentRowId, SESSION_HOURS);
        reply.header('set-cookie', sessionCookieHeader(request, session, SESSION_HOURS * 3600, request.server.config.secureCookie === 'always'));
        // The pages read their CSRF token from /v1/me or /v1/student/me, as after any sign-in; a student
        // goes straight to their own pages.
        return reply.redirect('staffId' in who ? '/' : '/student', 303);
      } catch (error) {
        return refuse(request, reply, error);
      }
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/lti/deep-link',
    access: 'public',
    transactional: true,
    summary:
      "A deep link's choice (from the page a deep linking request opens): the assignment and section, of the platform's course, answered with a page that posts our signed deep linking response to the platform",
    schema: { body: DeepLinkChoice, response: { 200: HtmlPage } },
    async handler(request, reply) {
      const { db, body } = request;
      try {
        // Taken from our own page only, as a launch's ticket is; the ticket is what proves the instructor's request.
        if (!sameOrigin(request)) throw new LaunchRefused('ticket-cross-site');
        const link = await takeDeepLink(db, body.ticket);
        if (!link) throw new LaunchRefused('ticket-unknown');
        const platform = (await getPlatform(db, link.platformId))!;
        const pair = { assignmentId: body.assignmentId, sectionId: body.sectionId };
        // A 400 rolls the transaction back: the ticket stays for a corrected choice.
        const wrong = await ofCourse(db, platform.courseId, pair);
        if (wrong !== true) throw new ApiError('invalid-input', undefined, [{ path: `body.${wrong}`, message: "not of the platform's course" }]);
        const { title } = (await getAssignment(db, pair.assignmentId))!;
        const jwt = await deepLinkingResponse(db, link, platform, { ...pair, title });
        request.log.info({ ltiDeepLink: pair }, 'LTI deep link answered');
        return html(reply, returnPage(link.returnUrl, jwt), returnPageHeaders(link.returnUrl));
      } catch (error) {
        return refuse(request, reply, error);
      }
    },
  }),
];

/**
 * A ticket is taken only from a page of this origin. A browser that sends Sec-Fetch-Site says so
 * itself; one that does not must send an Origin naming this origin (the launch's page sends its
 * origin to its own site: its Referrer-Policy is same-origin, as `no-referrer` would make it "null").
 * Anything else may be another site trying to sign this browser in as someone else.
 */
function sameOrigin(request: FastifyRequest): boolean {
  const site = request.headers['sec-fetch-site'];
  if (site !== undefined) return site === 'same-origin';
  return request.headers.origin === `${request.protocol}://${request.host}`;
}
