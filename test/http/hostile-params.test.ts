import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routes } from '../../server/routes/index.ts';
import { SESSION_COOKIE } from '../../server/http/session-cookie.ts';
import { bearer, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * No cookie and no path parameter can make the service answer 500: each hostile value gets a 4xx in
 * the common error shape. The values are the usual suspects of URL and cookie handling (common
 * practice, no source): a lone or truncated percent escape, an encoded NUL (PostgreSQL refuses NUL in
 * text), an encoded slash, a very long value, numbers past any id, signs and spaces.
 */
const HOSTILE = ['%', '%ZZ', '%E0%A4%A', '%00', 'S-001%00', '%2F..%2F', 'x'.repeat(400), '-1', '0', '1.5', '99999999999999999999', '%20', 'S%C3%A9', '%F0%9F%98%80'];

describe('hostile cookies and path parameters', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  const expectErrorShape = (res: { statusCode: number; body: string; json: () => unknown }, what: string) => {
    expect(res.statusCode, `${what}: ${res.body}`).toBeGreaterThanOrEqual(400);
    expect(res.statusCode, `${what}: ${res.body}`).toBeLessThan(500);
    expect(res.json(), what).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
  };

  it('every route answers a hostile value in each path parameter with a 4xx, never a 500', async () => {
    // Real ids for the parameters not under test, so that each hostile value reaches its own parameter's handling.
    const real: Record<string, string> = { courseId: String(s.course.id), sectionId: String(s.sectionA.id), assignmentId: String(s.assignment.id), staffId: String(s.taA.id), studentId: 'S-001', submissionId: '1', regradeId: '00000000-0000-4000-8000-000000000000' };
    let tried = 0;
    for (const route of routes) {
      const names = [...route.url.matchAll(/:(\w+)/g)].map((m) => m[1]);
      for (const name of names) {
        for (const value of HOSTILE) {
          const url = route.url.replace(/:(\w+)/g, (_, n: string) => (n === name ? value : real[n]));
          const res = await api.app.inject({ method: route.method, url, headers: bearer(s.instructorToken), payload: route.method === 'GET' ? undefined : {} });
          expectErrorShape(res, `${route.method} ${url}`);
          tried++;
        }
      }
    }
    expect(tried).toBeGreaterThan(300);
  }, 120_000);

  it('a NUL in the history URL\'s student id is a 400 naming params.studentId', async () => {
    const res = await api.app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/students/S-001%00/history`, headers: bearer(s.taAToken) });
    expect(res.statusCode, res.body).toBe(400);
    expect(res.json().error.details[0].path).toBe('params.studentId');
  });

  const COOKIES = ['%', '%ZZ', '%E0%A4%A', '%00', 'a%00b', '', '=', '"quoted"', '%C0%AF', 'x'.repeat(5000)];
  it.each(COOKIES.map((v) => [v.length > 20 ? `${v.slice(0, 8)}… (${v.length} characters)` : v, v]))('a session cookie %j answers 4xx, never 500', async (_label, value) => {
    for (const [method, url] of [['GET', '/v1/me'], ['GET', `/v1/sections/${s.sectionA.id}/roster`], ['DELETE', '/v1/session']] as const) {
      const res = await api.app.inject({ method, url, headers: { cookie: `other=1; ${SESSION_COOKIE}=${value}` } });
      if (method === 'DELETE' && res.statusCode === 204) continue;
      expectErrorShape(res, `${method} ${url} with cookie ${value.slice(0, 20)}`);
    }
  });

  it('a cookie that is not percent-encoding names the cookie', async () => {
    const res = await api.app.inject({ method: 'GET', url: '/v1/me', headers: { cookie: `${SESSION_COOKIE}=%` } });
    expect(res.statusCode, res.body).toBe(401);
    expect(res.json().error.details).toEqual([{ path: `cookie.${SESSION_COOKIE}`, message: expect.stringContaining('percent-encoding') }]);
  });
});
