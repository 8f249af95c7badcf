import type { FastifyInstance } from 'fastify';
import { decodeJwt, decodeProtectedHeader } from 'jose';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listPlatforms, placementOf } from '../../server/store/lti-platforms.ts';
import { ADMIN_TOKEN, call, type Seed } from '../support/api-fixture.ts';
import { PLATFORM_ROLES, TestPlatform, type PlatformUser } from '../support/lti-platform/test-platform.ts';
import { chooseToPlace, HOST, launchTool, postTicket, ticketOf } from '../support/lti-platform/tool-launch.ts';
import { openToolAndPlatform, type ToolAndPlatform } from '../support/lti-platform/tool-fixture.ts';
import type { TestDatabase } from '../support/test-database.ts';

/**
 * Deep Linking 2.0 from a test platform of our own (test/support/lti-platform): an instructor places
 * an assignment and section, the platform verifies our signed response against our key set with jose,
 * and the link it makes binds a learner's later launch. Sections of the specifications named beside
 * each check (from memory).
 */
const LTI = 'https://purl.imsglobal.org/spec/lti/claim/';
const DL = 'https://purl.imsglobal.org/spec/lti-dl/claim/';

// Invented people; their subject ids and names must never reach the log.
const instructor: PlatformUser = { sub: 'sub-dl-instructor-61aa', name: 'Ines Halloran', roles: PLATFORM_ROLES.instructor };
const ta: PlatformUser = { sub: 'sub-dl-ta-0c7e', name: 'Tomas Brinkley', roles: PLATFORM_ROLES.ta };
const learner: PlatformUser = { sub: 'sub-dl-learner-93fd', name: 'Lena Marwick', roles: PLATFORM_ROLES.learner };

describe('LTI Deep Linking 2.0 from a test platform', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let platform: TestPlatform;
  let seed: Seed;
  let secondAssignment: { id: number; title: string };
  let otherCourse: { assignment: { id: number }; section: { id: number } };
  let tool: ToolAndPlatform | undefined;
  const log: string[] = [];

  beforeAll(async () => {
    tool = await openToolAndPlatform({ log });
    ({ database, app, platform, seed } = tool);
    secondAssignment = (await call(app, 'POST', `/v1/courses/${seed.course.id}/assignments`, seed.instructorToken, { title: 'Ester hydrolysis (invented)', settings: seed.settings }, 201)).body;
    // Another course, with its own assignment and section, that the platform is not bound to.
    const other = (await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Another course (invented)' }, 201)).body;
    const otherInstructor = (await call(app, 'POST', `/v1/courses/${other.id}/staff`, ADMIN_TOKEN, { handle: 'other-instructor', role: 'instructor' }, 201)).body;
    const otherToken = (await call(app, 'POST', `/v1/staff/${otherInstructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token as string;
    otherCourse = {
      section: (await call(app, 'POST', `/v1/courses/${other.id}/sections`, otherToken, { name: 'Z' }, 201)).body,
      assignment: (await call(app, 'POST', `/v1/courses/${other.id}/assignments`, otherToken, { title: 'Elsewhere (invented)', settings: seed.settings }, 201)).body,
    };
  }, 60_000);
  afterAll(() => tool?.close());

  const launch = (user: PlatformUser, change: Parameters<TestPlatform['idToken']>[2] = {}) => launchTool(app, platform, user, change);
  const choose = (ticket: string, assignmentId: number, sectionId: number, headers?: Record<string, string>) => chooseToPlace(app, ticket, assignmentId, sectionId, headers);

  async function choicePage() {
    const res = await launch(instructor, { deepLinking: true });
    expect(res.statusCode, res.body).toBe(200);
    return res;
  }

  async function expectRefused(res: { statusCode: number; body: string; headers: Record<string, unknown> }, code: string) {
    expect(res.statusCode, res.body).toBe(401);
    expect(res.body).toContain(code);
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(log.some((line) => JSON.parse(line).ltiRefusal === code), `log has ${code}`).toBe(true);
  }

  it("an instructor's deep linking request opens a choice of the course's assignments and sections, and no session", async () => {
    const res = await choicePage();
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(res.body).toContain('action="/v1/lti/deep-link"');
    for (const label of [seed.assignment.title, secondAssignment.title, seed.sectionA.name, seed.sectionB.name]) expect(res.body).toContain(`>${label}</option>`);
    expect(res.body).not.toContain('Elsewhere (invented)');
  });

  it('the choice is answered with our deep linking response, which the platform verifies against our key set (Deep Linking 2.0, 4.5)', async () => {
    const answer = await choose(ticketOf((await choicePage()).body), secondAssignment.id, seed.sectionB.id);
    expect(answer.statusCode, answer.body).toBe(200);
    // Deep Linking 2.0, 4.5: the response is form-posted to the return URL as the field JWT; the page's
    // policy lets its form go to the platform (and nowhere else).
    expect(answer.body).toContain(`action="${platform.deepLinkReturnUrl}"`);
    expect(String(answer.headers['content-security-policy'])).toContain(`form-action ${platform.base};`);
    const jwt = /name="JWT" value="([^"]+)"/.exec(answer.body)![1];
    const keySet = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json();
    // The platform's own checks (jose, independent of the tool's code): signature by the kid named, iss, aud, data echoed, one resource link.
    const link = await platform.receiveDeepLinkingResponse(jwt, keySet);
    expect(link.title).toBe(secondAssignment.title);
    // Security Framework 1.0, 6.3 and the tool's key set: the header names our signing key.
    expect(keySet.keys.map((k: { kid: string }) => k.kid)).toContain(decodeProtectedHeader(jwt).kid);
    // Deep Linking 2.0, 4.5: iat and exp five minutes apart (the tool's own lifetime, hand-worked), a nonce, no other audience.
    const claims = decodeJwt(jwt);
    expect(claims.exp! - claims.iat!).toBe(300);
    expect(claims.aud).toBe(platform.issuer);
    expect(String(claims.nonce).length).toBeGreaterThanOrEqual(16);
    expect((claims[`${DL}content_items`] as unknown[]).length).toBe(1);
    expect(claims[`${LTI}message_type`]).toBe('LtiDeepLinkingResponse');

    // A learner's first launch of the link lands in the chosen section, and the placement is recorded
    // from the link's custom parameters (LTI Core 1.3, 5.4.6: they come back in each launch).
    const launched = await launch(learner, { claims: platform.linkClaims(link) });
    expect(launched.statusCode, launched.body).toBe(200);
    const entered = await postTicket(app, launched.body);
    expect(entered.statusCode, entered.body).toBe(303);
    expect(entered.headers.location).toBe('/student');
    const cookie = String(entered.headers['set-cookie']).split(';')[0];
    const me = (await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie } })).json();
    expect(me.section.id).toBe(seed.sectionB.id);
    expect(me.assignments.map((a: { id: number }) => a.id)).toContain(secondAssignment.id);
    const [registered] = await listPlatforms(database.store.db);
    expect(await placementOf(database.store.db, registered.id, platform.contextId, link.resourceLinkId)).toEqual({ assignmentId: secondAssignment.id, sectionId: seed.sectionB.id });
  });

  it("an assignment or section of another course is a 400 naming the field, and the request's ticket stays for a corrected choice", async () => {
    const ticket = ticketOf((await choicePage()).body);
    const wrongAssignment = await choose(ticket, otherCourse.assignment.id, seed.sectionA.id);
    expect(wrongAssignment.statusCode, wrongAssignment.body).toBe(400);
    expect(wrongAssignment.json().error.details.map((d: { path: string }) => d.path)).toEqual(['body.assignmentId']);
    const wrongSection = await choose(ticket, seed.assignment.id, otherCourse.section.id);
    expect(wrongSection.statusCode).toBe(400);
    expect(wrongSection.json().error.details.map((d: { path: string }) => d.path)).toEqual(['body.sectionId']);
    // Nothing was taken by the refused choices (the transaction rolled back): the same ticket now succeeds, once.
    expect((await choose(ticket, seed.assignment.id, seed.sectionA.id)).statusCode).toBe(200);
    await expectRefused(await choose(ticket, seed.assignment.id, seed.sectionA.id), 'ticket-unknown');
  });

  it('a choice posted from another site is refused (login cross-site request forgery, as for a launch ticket)', async () => {
    const ticket = ticketOf((await choicePage()).body);
    await expectRefused(await choose(ticket, seed.assignment.id, seed.sectionA.id, { ...HOST, origin: 'https://elsewhere.invalid' }), 'ticket-cross-site');
  });

  it.each([
    ['a teaching assistant', ta],
    ['a learner', learner],
  ])('%s may not place an activity: the deep linking request is refused (deep-linking-not-instructor)', async (_who, user) => {
    await expectRefused(await launch(user, { deepLinking: true }), 'deep-linking-not-instructor');
  });

  it('a deep linking request that does not accept LTI resource links is refused (Deep Linking 2.0, 4.4.1: accept_types)', async () => {
    const settings = { deep_link_return_url: platform.deepLinkReturnUrl, accept_types: ['file', 'html'], data: platform.deepLinkingData };
    await expectRefused(await launch(instructor, { deepLinking: true, claims: { [`${DL}deep_linking_settings`]: settings } }), 'link-type-not-accepted');
  });

  it('a deep linking request without its return URL is refused (Deep Linking 2.0, 4.4.1: deep_link_return_url is required)', async () => {
    const settings = { accept_types: ['ltiResourceLink'] };
    await expectRefused(await launch(instructor, { deepLinking: true, claims: { [`${DL}deep_linking_settings`]: settings } }), 'claims-missing');
  });

  it('a deep linking request is verified as a launch is: another audience is refused (Security Framework 1.0, 5.1.3 item 3)', async () => {
    await expectRefused(await launch(instructor, { deepLinking: true, aud: 'some-other-tool' }), 'wrong-audience');
  });

  it('a custom parameter naming a pair outside the platform\'s course places nothing: the learner sees the activity is not placed', async () => {
    const custom = { rateproof_assignment_id: String(otherCourse.assignment.id), rateproof_section_id: String(otherCourse.section.id) };
    const res = await launch(learner, { claims: { [`${LTI}resource_link`]: { id: 'link-forged-1' }, [`${LTI}custom`]: custom } });
    expect(res.statusCode).toBe(200);
    expect(res.body).toContain('not placed yet');
    const [registered] = await listPlatforms(database.store.db);
    expect(await placementOf(database.store.db, registered.id, platform.contextId, 'link-forged-1')).toBeUndefined();
  });

  it('the log names no subject id and no name of anyone who launched (common practice, no source: personal data only as ids)', () => {
    const text = log.join('\n');
    for (const user of [instructor, ta, learner]) {
      expect(text).not.toContain(user.sub);
      expect(text).not.toContain(user.name);
    }
  });
});
