import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ADMIN_TOKEN, bearer, call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * An id in a URL is digits without a sign, a leading zero, a point or an exponent. Every other way of
 * writing a number (what Number() would read as the same id: `1e0`, `01`, `1.0`, `+1`, ` 1`, `0x1`)
 * names nothing: a 404 (or a 400), never the record the number stands for and never a 500. The list
 * is written by hand (common practice, no source).
 */
const spellings = (n: number): string[] => [
  `${n}e0`,
  `${n}E0`,
  `0${n}`,
  `00${n}`,
  `${n}.0`,
  `${n}.`,
  `+${n}`,
  `-${n}`,
  `%20${n}`,
  `${n}%20`,
  `%09${n}`,
  `0x${n.toString(16)}`,
  `0b${n.toString(2)}`,
  `0o${n.toString(8)}`,
  `${n}_`,
  `${n}n`,
  '0',
  '-0',
  'NaN',
  'Infinity',
  '2147483648',
  '999999999999999',
  '1000000000000000',
  '99999999999999999999',
  `%EF%BC%91`, // a full-width digit one
];

describe('ids in URLs are read strictly', () => {
  let api: Api;
  let s: Seed;
  let submissionId: number;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    const stored = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001']), 201);
    submissionId = stored.body.stored[0].submissionId;
  }, 60_000);
  afterAll(async () => api?.close());

  it('the plain id opens the submission (the control for the cases below)', async () => {
    const res = await api.app.inject({ method: 'GET', url: `/v1/submissions/${submissionId}`, headers: bearer(s.taAToken) });
    expect(res.statusCode, res.body).toBe(200);
  });

  it('any other spelling of a submission id is a 404 or 400 in the error shape, never the submission and never a 500', async () => {
    for (const id of spellings(submissionId)) {
      const res = await api.app.inject({ method: 'GET', url: `/v1/submissions/${id}`, headers: bearer(s.taAToken) });
      expect([404, 400], `${id}: ${res.statusCode} ${res.body}`).toContain(res.statusCode);
      expect(res.json().error.code, id).toMatch(/^(not-found|invalid-input)$/);
      expect(res.json().submissionId, id).toBeUndefined();
    }
  });

  it('the same holds for course, section, assignment and staff ids, as the admin or the instructor', async () => {
    const urls = (id: string) => [
      [ADMIN_TOKEN, `/v1/staff/${id}/tokens`, 'POST'],
      [s.instructorToken, `/v1/courses/${id}/sections`, 'GET'],
      [s.instructorToken, `/v1/sections/${id}/roster`, 'GET'],
      [s.instructorToken, `/v1/assignments/${id}`, 'GET'],
      [s.instructorToken, `/v1/sections/${s.sectionA.id}/assignments/${id}/results`, 'GET'],
    ] as const;
    const real = { staff: s.taA.id, course: s.course.id, section: s.sectionA.id, assignment: s.assignment.id };
    for (const [kind, n] of Object.entries(real)) {
      for (const id of spellings(n)) {
        for (const [token, url, method] of urls(id)) {
          if (!url.includes(`/${kind === 'staff' ? 'staff' : `${kind}s`}/${id}`)) continue;
          const res = await api.app.inject({ method, url, headers: bearer(token) });
          expect([404, 400], `${method} ${url}: ${res.statusCode} ${res.body}`).toContain(res.statusCode);
        }
      }
    }
  });

  it('an assignment id in the query string is read as strictly, and named when wrong', async () => {
    const res = await api.app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/students/S-001/history?assignmentId=${s.assignment.id}e0`, headers: bearer(s.taAToken) });
    expect(res.statusCode, res.body).toBe(400);
    expect(res.json().error.details[0].path).toBe('querystring.assignmentId');
  });
});
