import type { FastifyInstance } from 'fastify';
import type { PlatformUser, TestPlatform } from './test-platform.ts';

/** The tool's address as the launch tests' requests name it (its host header and origin). */
export const TOOL = 'http://localhost:80';
export const HOST = { host: 'localhost:80' };
/** A request from our own pages: same host, same origin. */
export const SAME_ORIGIN = { ...HOST, origin: TOOL };
export const FORM = { 'content-type': 'application/x-www-form-urlencoded' };
export const form = (fields: Record<string, string>) => new URLSearchParams(fields).toString();

type IdTokenChange = Parameters<TestPlatform['idToken']>[2];

/**
 * Security Framework 1.0, 5.1.1.1-5.1.1.2: the platform initiates login and the tool redirects with
 * state and nonce; answers the platform's reading of that authentication request. Throws on a login
 * that does not redirect.
 */
export async function initiate(app: FastifyInstance, platform: TestPlatform, user: PlatformUser) {
  const login = await app.inject({ method: 'GET', url: `/v1/lti/login?${form(platform.loginInitiation(user, TOOL))}`, headers: HOST });
  if (login.statusCode !== 302) throw new Error(`login: ${login.statusCode} ${login.body}`);
  return platform.readAuthRequest(String(login.headers.location), user);
}

/** Security Framework 1.0, 5.1.1.3: the platform form-posts the id_token with the state (fields as given, for refusals). */
export function postLaunch(app: FastifyInstance, fields: Record<string, string>) {
  return app.inject({ method: 'POST', url: '/v1/lti/launch', headers: FORM, payload: form(fields) });
}

/**
 * A whole launch of the tool from the test platform (Security Framework 1.0, 5.1.1.1-5.1.1.3): login
 * initiated, the platform's side of the authentication request read, its id_token posted back with
 * the state. `change` alters the id_token as TestPlatform.idToken takes it. Throws on a login that
 * does not redirect; answers the launch's response whatever it is.
 */
export async function launchTool(app: FastifyInstance, platform: TestPlatform, user: PlatformUser, change: IdTokenChange = {}) {
  const auth = await initiate(app, platform, user);
  return postLaunch(app, { id_token: await platform.idToken(user, auth.nonce, change), state: auth.state });
}

/** The one-time ticket a launch's page (or the deep linking choice page) carries. */
export function ticketOf(page: string): string {
  const ticket = /name="ticket" value="([^"]+)"/.exec(page)?.[1];
  if (ticket === undefined) throw new Error(`no ticket on the page: ${page.slice(0, 200)}`);
  return ticket;
}

/** The launch page's ticket posted back to the tool; `headers` stand for where the post comes from. Answers the response whatever it is. */
export function postTicket(app: FastifyInstance, page: string, headers: Record<string, string> = SAME_ORIGIN) {
  return app.inject({ method: 'POST', url: '/v1/lti/enter', headers: { ...FORM, ...headers }, payload: form({ ticket: ticketOf(page) }) });
}

/** The same-site step after a launch: the ticket posted from our own origin; the session cookie set. */
export async function enterTool(app: FastifyInstance, page: string): Promise<string> {
  const entered = await postTicket(app, page);
  if (entered.statusCode !== 303) throw new Error(`enter: ${entered.statusCode} ${entered.body}`);
  return String(entered.headers['set-cookie']).split(';')[0];
}

/** The instructor's deep linking choice, posted from our own page unless `headers` say otherwise; answers the page that posts our response. */
export function chooseToPlace(app: FastifyInstance, ticket: string, assignmentId: number, sectionId: number, headers: Record<string, string> = SAME_ORIGIN) {
  return app.inject({ method: 'POST', url: '/v1/lti/deep-link', headers: { ...FORM, ...headers }, payload: form({ ticket, assignmentId: String(assignmentId), sectionId: String(sectionId) }) });
}
