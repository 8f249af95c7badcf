import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Access } from '../../server/http/access.ts';
import { SESSION_COOKIE } from '../../server/http/session-cookie.ts';
import { routes } from '../../server/routes/index.ts';
import { ADMIN_TOKEN, call, openApi, regradeAndWait, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * Every route x every kind of caller, generated from the route table: a route without an example
 * request below fails the first test, so a new route cannot escape the matrix. Students call with a
 * session cookie and the page's CSRF header, as their pages do.
 */
type Role = 'admin' | 'instructor' | 'ta-of-section' | 'ta-of-other-section' | 'student-of-section' | 'student-of-other-section' | 'no-token' | 'bad-token';
const roles: Role[] = ['admin', 'instructor', 'ta-of-section', 'ta-of-other-section', 'student-of-section', 'student-of-other-section', 'no-token', 'bad-token'];
type Outcome = 'ok' | 302 | 401 | 403 | 404 | 409;

/** To a student the staff API is as if absent: every staff route answers them as a missing one. */
const staffOnly = { 'student-of-section': 404, 'student-of-other-section': 404 } as const;

// Expected outcome by access rule: 'ok' is any 2xx (derived from the access rules in server/http/access.ts, written out by hand).
const expected: Record<Access, Record<Role, Outcome>> = {
  admin: { admin: 'ok', instructor: 403, 'ta-of-section': 403, 'ta-of-other-section': 403, ...staffOnly, 'no-token': 401, 'bad-token': 401 },
  instructor: { admin: 'ok', instructor: 'ok', 'ta-of-section': 403, 'ta-of-other-section': 403, ...staffOnly, 'no-token': 401, 'bad-token': 401 },
  course: { admin: 403, instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', ...staffOnly, 'no-token': 401, 'bad-token': 401 },
  section: { admin: 403, instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 404, ...staffOnly, 'no-token': 401, 'bad-token': 401 },
  'signed-in': { admin: 'ok', instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', ...staffOnly, 'no-token': 401, 'bad-token': 401 },
  // The students' own routes: to staff and the admin token they are as if absent. A student route
  // names no student, so a student of the other section gets their own view; that it holds nothing
  // of section A's students is checked below for every answer.
  student: { admin: 404, instructor: 404, 'ta-of-section': 404, 'ta-of-other-section': 404, 'student-of-section': 'ok', 'student-of-other-section': 'ok', 'no-token': 401, 'bad-token': 401 },
  // Signing in and out: whatever the Authorization header says, the body's token or code (or the cookie) decides.
  public: { admin: 'ok', instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', 'student-of-section': 'ok', 'student-of-other-section': 'ok', 'no-token': 'ok', 'bad-token': 'ok' },
};

const everyone = (outcome: Outcome): Record<Role, Outcome> => Object.fromEntries(roles.map((r) => [r, outcome])) as Record<Role, Outcome>;

/**
 * Where one route's answer to a role differs from its access rule's, and why. Issuing a code records
 * the staff member who issued it, so the admin token, let through on instructor routes, is refused.
 */
const exceptions: Record<string, Partial<Record<Role, Outcome>>> = {
  'POST /v1/sections/:sectionId/access-codes': { admin: 403 },
  // Setting a deadline records who set it, as issuing a code does.
  'PUT /v1/sections/:sectionId/assignments/:assignmentId/deadline': { admin: 403 },
  // Section A's work was released in the set-up; nothing was released to the other section's student.
  'GET /v1/student/assignments/:assignmentId/feedback': { 'student-of-other-section': 404 },
  'GET /v1/student/assignments/:assignmentId/feedback.pdf': { 'student-of-other-section': 404 },
  // A login initiation from a registered platform redirects to it, whoever calls.
  'GET /v1/lti/login': everyone(302),
  'POST /v1/lti/login': everyone(302),
  // Without a platform's signed id_token (test/http/lti-launch.test.ts runs whole launches), a launch
  // and a ticket are refused alike for every caller: a session of any kind opens neither.
  'POST /v1/lti/launch': everyone(401),
  'POST /v1/lti/enter': everyone(401),
  // A deep link's choice is proven by the ticket a verified deep linking request made
  // (test/http/lti-deep-linking.test.ts), never by a session: without one, refused for every caller.
  'POST /v1/lti/deep-link': everyone(401),
  // No staff launch has sent the context's membership URL here, so a pull is a 409 for those let
  // through (test/http/lti-roster.test.ts pulls from a test platform's membership service).
  'POST /v1/sections/:sectionId/roster/pull': { admin: 409, instructor: 409 },
};

/** A clean submission without a student id, as a student sends their own. */
function ownSubmission(seed: number) {
  const { studentId: _, ...own } = submissionsFor(['S-000'], seed)[0];
  return own;
}

/** The students of the seeded roster, by section; the matrix's students are the first of each. */
const studentsOfA = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'];
const studentsOfB = ['S-101', 'S-102', 'S-103'];
const studentOf = { 'student-of-section': 'S-001', 'student-of-other-section': 'S-101' } as const;

interface Fixture extends Seed {
  regradeId: string;
  /** A drawn summary of section A, as a large section's download stores it. */
  fileId: string;
  submissionId: number;
  findingId: string;
  spare: { id: number };
  /** The access codes of the matrix's two students. */
  codes: Record<keyof typeof studentOf, string>;
  platformId: number;
}

/** A platform registered in the set-up (nothing listens at its URLs: no launch completes in the matrix). */
const PLATFORM_ISSUER = 'https://platform.invalid';
const platformOf = (courseId: number) => ({
  courseId,
  issuer: PLATFORM_ISSUER,
  clientId: 'client-0',
  deploymentIds: ['deployment-1'],
  authUrl: 'https://platform.invalid/auth',
  tokenUrl: 'https://platform.invalid/token',
  jwksUrl: 'https://platform.invalid/jwks',
});

let n = 0;
const unique = () => ++n;

/** A valid request for each route, pointing into section A of the seeded course. */
const examples: Record<string, (f: Fixture) => { url: string; body?: unknown }> = {
  'GET /v1/session': () => ({ url: '/v1/session' }),
  'POST /v1/session': (f) => ({ url: '/v1/session', body: { token: f.taAToken } }),
  // Without a session cookie, signing out has nothing to end and clears the cookie all the same.
  'DELETE /v1/session': () => ({ url: '/v1/session' }),
  'GET /v1/me': () => ({ url: '/v1/me' }),
  'GET /v1/kinds': () => ({ url: '/v1/kinds' }),
  'GET /v1/courses': () => ({ url: '/v1/courses' }),
  'POST /v1/courses': () => ({ url: '/v1/courses', body: { name: `Course ${unique()}` } }),
  'GET /v1/courses/:courseId': (f) => ({ url: `/v1/courses/${f.course.id}` }),
  'POST /v1/courses/:courseId/sections': (f) => ({ url: `/v1/courses/${f.course.id}/sections`, body: { name: `Section ${unique()}` } }),
  'GET /v1/courses/:courseId/sections': (f) => ({ url: `/v1/courses/${f.course.id}/sections` }),
  'POST /v1/courses/:courseId/staff': (f) => ({ url: `/v1/courses/${f.course.id}/staff`, body: { handle: `ta-${unique()}`, role: 'ta', sectionIds: [f.sectionA.id] } }),
  'GET /v1/courses/:courseId/staff': (f) => ({ url: `/v1/courses/${f.course.id}/staff` }),
  'POST /v1/staff/:staffId/tokens': (f) => ({ url: `/v1/staff/${f.taA.id}/tokens` }),
  // A spare TA's tokens: revoking those of the callers in the matrix would change the answers after it.
  'POST /v1/staff/:staffId/tokens/revoke': (f) => ({ url: `/v1/staff/${f.spare.id}/tokens/revoke` }),
  'POST /v1/sections/:sectionId/roster': (f) => ({ url: `/v1/sections/${f.sectionA.id}/roster`, body: { students: [{ studentId: 'S-001' }] } }),
  'PUT /v1/sections/:sectionId/roster/:studentId': (f) => ({ url: `/v1/sections/${f.sectionA.id}/roster/S-006`, body: { status: 'enrolled' } }),
  'GET /v1/sections/:sectionId/access-codes': (f) => ({ url: `/v1/sections/${f.sectionA.id}/access-codes` }),
  // A spare student's code: reissuing or revoking the matrix students' own would sign them out.
  'POST /v1/sections/:sectionId/access-codes': (f) => ({ url: `/v1/sections/${f.sectionA.id}/access-codes`, body: { studentIds: ['S-004'] } }),
  'POST /v1/sections/:sectionId/access-codes/revoke': (f) => ({ url: `/v1/sections/${f.sectionA.id}/access-codes/revoke`, body: { studentIds: ['S-004'] } }),
  'POST /v1/student/session': (f) => ({ url: '/v1/student/session', body: { code: f.codes['student-of-section'] } }),
  'GET /v1/sections/:sectionId/roster': (f) => ({ url: `/v1/sections/${f.sectionA.id}/roster` }),
  'POST /v1/sections/:sectionId/roster/pull': (f) => ({ url: `/v1/sections/${f.sectionA.id}/roster/pull` }),
  'POST /v1/courses/:courseId/assignments': (f) => ({ url: `/v1/courses/${f.course.id}/assignments`, body: { title: `Assignment ${unique()}`, settings: f.settings } }),
  'GET /v1/assignments/:assignmentId': (f) => ({ url: `/v1/assignments/${f.assignment.id}` }),
  // The settings as stored (every setting stated), as a PUT must send them.
  'PUT /v1/assignments/:assignmentId/settings': (f) => ({ url: `/v1/assignments/${f.assignment.id}/settings`, body: { settings: f.assignment.settings } }),
  'PATCH /v1/assignments/:assignmentId/settings': (f) => ({ url: `/v1/assignments/${f.assignment.id}/settings`, body: { settings: { rubric: { k: 2 } } } }),
  'POST /v1/assignments/:assignmentId/regrade': (f) => ({ url: `/v1/assignments/${f.assignment.id}/regrade`, body: {} }),
  'GET /v1/assignments/:assignmentId/regrades/latest': (f) => ({ url: `/v1/assignments/${f.assignment.id}/regrades/latest` }),
  'GET /v1/assignments/:assignmentId/regrades/:regradeId': (f) => ({ url: `/v1/assignments/${f.assignment.id}/regrades/${f.regradeId}` }),
  'POST /v1/sections/:sectionId/assignments/:assignmentId/submissions': (f) => ({
    url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/submissions`,
    body: submissionsFor(['S-002'], unique()),
  }),
  'GET /v1/submissions/:submissionId': (f) => ({ url: `/v1/submissions/${f.submissionId}` }),
  'GET /v1/submissions/:submissionId/display': (f) => ({ url: `/v1/submissions/${f.submissionId}/display` }),
  'POST /v1/submissions/:submissionId/overrides': (f) => ({ url: `/v1/submissions/${f.submissionId}/overrides`, body: { findingId: f.findingId, pointsLost: 1, reason: 'checked by hand' } }),
  'POST /v1/submissions/:submissionId/signals': (f) => ({ url: `/v1/submissions/${f.submissionId}/signals`, body: { code: 'temperature-spread', path: 'runs', onSheet: true } }),
  'GET /v1/sections/:sectionId/students/:studentId/history': (f) => ({ url: `/v1/sections/${f.sectionA.id}/students/S-001/history` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/results': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/results` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/signals': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/signals` }),
  'POST /v1/sections/:sectionId/assignments/:assignmentId/release': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/release` }),
  'POST /v1/submissions/:submissionId/release': (f) => ({ url: `/v1/submissions/${f.submissionId}/release` }),
  'POST /v1/sections/:sectionId/assignments/:assignmentId/passback': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/passback` }),
  'GET /v1/submissions/:submissionId/feedback.pdf': (f) => ({ url: `/v1/submissions/${f.submissionId}/feedback.pdf` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/feedback.zip': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/feedback.zip` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/summary.pdf': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/summary.pdf` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/files/:fileId': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/files/${f.fileId}` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/files/:fileId/content': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/files/${f.fileId}/content` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/gradebook.csv': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/gradebook.csv` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/deadline': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/deadline` }),
  // Far ahead: the submissions other examples store stay on time.
  'PUT /v1/sections/:sectionId/assignments/:assignmentId/deadline': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/deadline`, body: { dueAt: '2099-01-01T00:00:00Z' } }),
  'POST /v1/submissions/:submissionId/accept-late': (f) => ({ url: `/v1/submissions/${f.submissionId}/accept-late` }),
  'GET /v1/student/me': () => ({ url: '/v1/student/me' }),
  // No student id in the body: each student of the matrix submits as themselves.
  'POST /v1/student/assignments/:assignmentId/submissions': (f) => ({ url: `/v1/student/assignments/${f.assignment.id}/submissions`, body: ownSubmission(unique()) }),
  'GET /v1/student/assignments/:assignmentId/feedback': (f) => ({ url: `/v1/student/assignments/${f.assignment.id}/feedback` }),
  'GET /v1/student/assignments/:assignmentId/feedback.pdf': (f) => ({ url: `/v1/student/assignments/${f.assignment.id}/feedback.pdf` }),
  'POST /v1/lti/platforms': (f) => ({ url: '/v1/lti/platforms', body: { ...platformOf(f.course.id), clientId: `client-${unique()}` } }),
  'GET /v1/lti/platforms': () => ({ url: '/v1/lti/platforms' }),
  'PUT /v1/lti/platforms/:platformId': (f) => ({ url: `/v1/lti/platforms/${f.platformId}`, body: platformOf(f.course.id) }),
  'POST /v1/lti/keys/rotate': () => ({ url: '/v1/lti/keys/rotate' }),
  'PUT /v1/sections/:sectionId/assignments/:assignmentId/lti-placement': (f) => ({
    url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/lti-placement`,
    body: { platformId: f.platformId, contextId: 'context-1', resourceLinkId: 'link-1' },
  }),
  'GET /v1/lti/jwks': () => ({ url: '/v1/lti/jwks' }),
  'GET /v1/lti/login': () => ({ url: `/v1/lti/login?iss=${encodeURIComponent(PLATFORM_ISSUER)}&client_id=client-0&login_hint=user-1&target_link_uri=${encodeURIComponent('https://tool.invalid/')}` }),
  'POST /v1/lti/login': () => ({ url: '/v1/lti/login', body: { iss: PLATFORM_ISSUER, client_id: 'client-0', login_hint: 'user-1', target_link_uri: 'https://tool.invalid/' } }),
  'POST /v1/lti/launch': () => ({ url: '/v1/lti/launch', body: { id_token: 'not.a.token', state: 'not-a-state' } }),
  'POST /v1/lti/enter': () => ({ url: '/v1/lti/enter', body: { ticket: 'not-a-ticket' } }),
  'POST /v1/lti/deep-link': (f) => ({ url: '/v1/lti/deep-link', body: { ticket: 'not-a-ticket', assignmentId: String(f.assignment.id), sectionId: String(f.sectionA.id) } }),
};

describe('authorisation matrix: every route x every caller', () => {
  let api: Api;
  let f: Fixture;
  const tokenOf = (role: Role): string | undefined =>
    ({ admin: ADMIN_TOKEN, instructor: f.instructorToken, 'ta-of-section': f.taAToken, 'ta-of-other-section': f.taBToken, 'no-token': undefined, 'bad-token': 'rp_not-a-real-token' })[role as Exclude<Role, keyof typeof studentOf>];

  /** A student's fresh session (signing out in one case leaves the next untouched): the cookie and the page's CSRF header. */
  async function studentHeaders(role: keyof typeof studentOf) {
    const res = await api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code: f.codes[role] } });
    expect(res.statusCode, res.body).toBe(201);
    const cookie = String(res.headers['set-cookie']).split(';')[0];
    expect(cookie.startsWith(`${SESSION_COOKIE}=`)).toBe(true);
    return { cookie, 'x-csrf-token': res.json().csrfToken as string };
  }

  /** Sends the example as the role: a token in Authorization, or a student's cookie and CSRF header. */
  async function send(role: Role, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, body: unknown) {
    if (!(role in studentOf)) return call(api.app, method, url, tokenOf(role), body);
    const headers = await studentHeaders(role as keyof typeof studentOf);
    const res = await api.app.inject({ method, url, headers, ...(body === undefined ? {} : { payload: body as object }) });
    return { status: res.statusCode, body: res.headers['content-type']?.toString().includes('json') ? res.json() : res.body };
  }

  beforeAll(async () => {
    api = await openApi();
    const seed = await seedCourse(api.app);
    const [slipped] = submissionsFor(['S-001'], 99);
    slipped.runs[0].reported!.k!.value = -Number(slipped.runs[0].reported!.k!.value);
    // Runs recorded 2.5 degC apart: a signal for review to put on the sheet.
    slipped.runs[0].temperatureC = 25;
    slipped.runs[1].temperatureC = 27.5;
    const stored = await call(api.app, 'POST', `/v1/sections/${seed.sectionA.id}/assignments/${seed.assignment.id}/submissions`, seed.taAToken, [slipped], 201);
    const spare = (await call(api.app, 'POST', `/v1/courses/${seed.course.id}/staff`, seed.instructorToken, { handle: 'ta-spare', role: 'ta', sectionIds: [seed.sectionA.id] }, 201)).body;
    const { started } = await regradeAndWait(api.app, seed.instructorToken, seed.assignment.id);
    // Released, so that section A's student has feedback to read.
    await call(api.app, 'POST', `/v1/sections/${seed.sectionA.id}/assignments/${seed.assignment.id}/release`, seed.taAToken, undefined, 200);
    // Drawn here by hand: this service's limit keeps the seeded sections small.
    const file = await api.app.sectionFiles.request(api.database.store.db, seed.sectionA.id, seed.assignment.id, 'summary.pdf');
    await api.app.sectionFiles.draw(api.database.store.db, { fileId: file.fileId });
    const issue = async (sectionId: number, studentId: string) =>
      (await call(api.app, 'POST', `/v1/sections/${sectionId}/access-codes`, seed.instructorToken, { studentIds: [studentId] }, 201)).body.codes[0].code as string;
    const codes = { 'student-of-section': await issue(seed.sectionA.id, 'S-001'), 'student-of-other-section': await issue(seed.sectionB.id, 'S-101') };
    const platform = await call(api.app, 'POST', '/v1/lti/platforms', ADMIN_TOKEN, platformOf(seed.course.id), 201);
    f = { ...seed, regradeId: started.regradeId, fileId: file.fileId, submissionId: stored.body.stored[0].submissionId, findingId: 'sign-flipped@runs[0].reported.k', spare, codes, platformId: platform.body.id };
  }, 60_000);
  afterAll(async () => api?.close());

  it('has an example request for every route in the table', () => {
    expect(routes.map((r) => `${r.method} ${r.url}`).filter((key) => !examples[key])).toEqual([]);
  });

  const cases = routes.flatMap((r) => roles.map((role) => ({ route: `${r.method} ${r.url}`, access: r.access, method: r.method, role })));
  it.each(cases)('$route as $role', async ({ route, access, method, role }) => {
    const { url, body } = examples[route](f);
    const res = await send(role, method, url, body);
    const want = exceptions[route]?.[role] ?? expected[access][role];
    if (want === 'ok') expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(200);
    if (want === 'ok') expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else expect(res.status, JSON.stringify(res.body)).toBe(want);
    if (role in studentOf) {
      // No answer to a student names any other student of the course (common practice, no source: a leak check by the ids seeded).
      const own = studentOf[role as keyof typeof studentOf];
      const text = typeof res.body === 'string' ? res.body : JSON.stringify(res.body);
      expect([...studentsOfA, ...studentsOfB].filter((id) => id !== own && text.includes(id))).toEqual([]);
    }
  });

  it('a student asking for a staff route gets the same answer as for a missing route', async () => {
    const headers = await studentHeaders('student-of-section');
    const staffRoute = await api.app.inject({ method: 'GET', url: `/v1/sections/${f.sectionA.id}/roster`, headers });
    const missing = await api.app.inject({ method: 'GET', url: '/v1/sections/999999/roster', headers });
    expect([staffRoute.statusCode, staffRoute.json()]).toEqual([missing.statusCode, missing.json()]);
  });

  it('instructors are managed by the admin alone: an instructor may not add one, nor issue or revoke a fellow instructor\'s tokens', async () => {
    const fellow = (await call(api.app, 'POST', `/v1/courses/${f.course.id}/staff`, ADMIN_TOKEN, { handle: 'instructor-2', role: 'instructor' }, 201)).body;
    const refused = [
      await call(api.app, 'POST', `/v1/courses/${f.course.id}/staff`, f.instructorToken, { handle: 'instructor-3', role: 'instructor' }),
      await call(api.app, 'POST', `/v1/staff/${fellow.id}/tokens`, f.instructorToken),
      await call(api.app, 'POST', `/v1/staff/${fellow.id}/tokens/revoke`, f.instructorToken),
      await call(api.app, 'POST', `/v1/staff/${f.instructor.id}/tokens`, f.instructorToken),
    ];
    for (const res of refused) expect([res.status, res.body.error.message]).toEqual([403, 'only the admin adds instructors or manages their tokens']);
    await call(api.app, 'POST', `/v1/staff/${fellow.id}/tokens`, ADMIN_TOKEN, undefined, 201);
    await call(api.app, 'POST', `/v1/staff/${fellow.id}/tokens/revoke`, ADMIN_TOKEN, undefined, 200);
  });

  it('a TA asking for another section gets the same answer as for a missing one', async () => {
    const other = await call(api.app, 'GET', `/v1/sections/${f.sectionA.id}/roster`, f.taBToken);
    const missing = await call(api.app, 'GET', '/v1/sections/999999/roster', f.taBToken);
    expect([other.status, other.body]).toEqual([missing.status, missing.body]);
  });
});
