import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Access } from '../../server/http/access.ts';
import { routes } from '../../server/routes/index.ts';
import { ADMIN_TOKEN, call, openApi, regradeAndWait, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * Every route x every kind of caller, generated from the route table: a route without an example
 * request below fails the first test, so a new route cannot escape the matrix.
 */
type Role = 'admin' | 'instructor' | 'ta-of-section' | 'ta-of-other-section' | 'no-token' | 'bad-token';
const roles: Role[] = ['admin', 'instructor', 'ta-of-section', 'ta-of-other-section', 'no-token', 'bad-token'];

// Expected outcome by access rule: 'ok' is any 2xx.
const expected: Record<Access, Record<Role, 'ok' | 401 | 403 | 404>> = {
  admin: { admin: 'ok', instructor: 403, 'ta-of-section': 403, 'ta-of-other-section': 403, 'no-token': 401, 'bad-token': 401 },
  instructor: { admin: 'ok', instructor: 'ok', 'ta-of-section': 403, 'ta-of-other-section': 403, 'no-token': 401, 'bad-token': 401 },
  course: { admin: 403, instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', 'no-token': 401, 'bad-token': 401 },
  section: { admin: 403, instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 404, 'no-token': 401, 'bad-token': 401 },
  'signed-in': { admin: 'ok', instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', 'no-token': 401, 'bad-token': 401 },
  // The students' own routes: to staff and the admin token they are as if absent.
  student: { admin: 404, instructor: 404, 'ta-of-section': 404, 'ta-of-other-section': 404, 'no-token': 401, 'bad-token': 401 },
  // Signing in and out: whatever the Authorization header says, the body's token (or the cookie) decides.
  public: { admin: 'ok', instructor: 'ok', 'ta-of-section': 'ok', 'ta-of-other-section': 'ok', 'no-token': 'ok', 'bad-token': 'ok' },
};

interface Fixture extends Seed {
  regradeId: string;
  /** A drawn summary of section A, as a large section's download stores it. */
  fileId: string;
  submissionId: number;
  findingId: string;
  spare: { id: number };
}

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
  'GET /v1/sections/:sectionId/roster': (f) => ({ url: `/v1/sections/${f.sectionA.id}/roster` }),
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
  'GET /v1/submissions/:submissionId/feedback.pdf': (f) => ({ url: `/v1/submissions/${f.submissionId}/feedback.pdf` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/feedback.zip': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/feedback.zip` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/summary.pdf': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/summary.pdf` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/files/:fileId': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/files/${f.fileId}` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/files/:fileId/content': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/files/${f.fileId}/content` }),
  'GET /v1/sections/:sectionId/assignments/:assignmentId/gradebook.csv': (f) => ({ url: `/v1/sections/${f.sectionA.id}/assignments/${f.assignment.id}/gradebook.csv` }),
};

describe('authorisation matrix: every route x every caller', () => {
  let api: Api;
  let f: Fixture;
  const tokenOf = (role: Role): string | undefined =>
    ({ admin: ADMIN_TOKEN, instructor: f.instructorToken, 'ta-of-section': f.taAToken, 'ta-of-other-section': f.taBToken, 'no-token': undefined, 'bad-token': 'rp_not-a-real-token' })[role];

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
    // Drawn here by hand: this service's limit keeps the seeded sections small.
    const file = await api.app.sectionFiles.request(api.database.store.db, seed.sectionA.id, seed.assignment.id, 'summary.pdf');
    await api.app.sectionFiles.draw(api.database.store.db, { fileId: file.fileId });
    f = { ...seed, regradeId: started.regradeId, fileId: file.fileId, submissionId: stored.body.stored[0].submissionId, findingId: 'sign-flipped@runs[0].reported.k', spare };
  }, 60_000);
  afterAll(async () => api?.close());

  it('has an example request for every route in the table', () => {
    expect(routes.map((r) => `${r.method} ${r.url}`).filter((key) => !examples[key])).toEqual([]);
  });

  const cases = routes.flatMap((r) => roles.map((role) => ({ route: `${r.method} ${r.url}`, access: r.access, method: r.method, role })));
  it.each(cases)('$route as $role', async ({ route, access, method, role }) => {
    const { url, body } = examples[route](f);
    const res = await call(api.app, method, url, tokenOf(role), body);
    const want = expected[access][role];
    if (want === 'ok') expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(200);
    if (want === 'ok') expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    else expect(res.status, JSON.stringify(res.body)).toBe(want);
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
