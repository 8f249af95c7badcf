import type { FastifyRequest } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SESSION_COOKIE, sessionCookieHeader } from '../../server/http/session-cookie.ts';
import { ADMIN_TOKEN, call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/** The workspace's sign-in: a token exchanged for an HttpOnly session cookie, changes guarded by x-csrf-token. */
describe('workspace sessions', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001']), 201);
  }, 60_000);
  afterAll(async () => api?.close());

  const signIn = async (token: string) => {
    const res = await api.app.inject({ method: 'POST', url: '/v1/session', payload: { token } });
    const setCookie = String(res.headers['set-cookie'] ?? '');
    return { res, setCookie, cookie: setCookie.split(';')[0] };
  };
  const release = (cookie: string, csrf?: string) =>
    api.app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, headers: { cookie, ...(csrf ? { 'x-csrf-token': csrf } : {}) } });

  it('signs a TA in with a cookie no script can read, and shows them only their own section', async () => {
    const { res, setCookie, cookie } = await signIn(s.taAToken);
    expect(res.statusCode).toBe(201);
    expect(setCookie).toMatch(new RegExp(`^${SESSION_COOKIE}=[A-Za-z0-9_-]{40,}; Path=/; HttpOnly; SameSite=Strict; Max-Age=28800$`));
    expect(setCookie).not.toContain(s.taAToken);
    const me = await api.app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } });
    expect(me.statusCode).toBe(200);
    expect(me.json()).toMatchObject({ role: 'ta', handle: 'ta-a', csrfToken: res.json().csrfToken });
    expect(me.json().courses).toEqual([
      { id: s.course.id, name: s.course.name, sections: [{ id: s.sectionA.id, name: 'A' }], assignments: [{ id: s.assignment.id, title: s.assignment.title, kind: 'first-order-catalysis' }] },
    ]);
    const courses = await api.app.inject({ method: 'GET', url: '/v1/courses', headers: { cookie } });
    expect(courses.json().map((c: { id: number }) => c.id)).toEqual([s.course.id]);
  });

  it('refuses a change sent with the cookie alone (as a cross-site form would) and makes it with the page token', async () => {
    const { res, cookie } = await signIn(s.taAToken);
    const forged = await release(cookie);
    expect(forged.statusCode).toBe(403);
    expect(forged.json().error.message).toContain('x-csrf-token');
    expect((await release(cookie, 'not-the-token')).statusCode).toBe(403);
    expect((await release(cookie, res.json().csrfToken)).statusCode).toBe(200);
  });

  it('keeps another section closed to a TA signed in by cookie', async () => {
    const { cookie } = await signIn(s.taBToken);
    const other = await api.app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, headers: { cookie } });
    expect(other.statusCode).toBe(404);
  });

  it('answers the page\'s session probe with 200 and whether the cookie is a live session', async () => {
    const probe = (cookie?: string) => api.app.inject({ method: 'GET', url: '/v1/session', headers: cookie ? { cookie } : {} });
    const none = await probe();
    expect([none.statusCode, none.json()]).toEqual([200, { signedIn: false, as: null }]);
    expect((await probe(`${SESSION_COOKIE}=not-a-session`)).json()).toEqual({ signedIn: false, as: null });
    const { cookie } = await signIn(s.taAToken);
    expect((await probe(cookie)).json()).toEqual({ signedIn: true, as: 'staff' });
  });

  it('refuses the admin token, a wrong token and an empty one, each with its reason', async () => {
    expect((await signIn(ADMIN_TOKEN)).res.statusCode).toBe(403);
    const wrong = await signIn('rp_not-a-real-token');
    expect([wrong.res.statusCode, wrong.setCookie]).toEqual([401, '']);
    const empty = await signIn('');
    expect(empty.res.statusCode).toBe(400);
    expect(empty.res.json().error.details).toEqual([{ path: 'body.token', message: 'the token is empty' }]);
  });

  it('signs out: the cookie is cleared and the session answers 401 from then on', async () => {
    const { res, cookie } = await signIn(s.taAToken);
    const out = await api.app.inject({ method: 'DELETE', url: '/v1/session', headers: { cookie, 'x-csrf-token': res.json().csrfToken } });
    expect(out.statusCode).toBe(204);
    expect(String(out.headers['set-cookie'])).toContain('Max-Age=0');
    const after = await api.app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } });
    expect([after.statusCode, after.json().error.message]).toEqual([401, 'the session has ended; sign in again']);
  });

  it('ends every session of a staff member whose tokens are revoked', async () => {
    const staff = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/staff`, s.instructorToken, { handle: 'ta-leaving', role: 'ta', sectionIds: [s.sectionA.id] }, 201)).body;
    const token = (await call(api.app, 'POST', `/v1/staff/${staff.id}/tokens`, s.instructorToken, undefined, 201)).body.token;
    const { cookie } = await signIn(token);
    expect((await api.app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } })).statusCode).toBe(200);
    await call(api.app, 'POST', `/v1/staff/${staff.id}/tokens/revoke`, s.instructorToken, undefined, 200);
    expect((await api.app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } })).statusCode).toBe(401);
  });

  it('marks the cookie Secure when the service is reached over TLS, or always when configured so (behind a TLS proxy)', () => {
    const secure = `${SESSION_COOKIE}=v; Path=/; HttpOnly; SameSite=Strict; Max-Age=60; Secure`;
    expect(sessionCookieHeader({ protocol: 'https' } as FastifyRequest, 'v', 60)).toBe(secure);
    expect(sessionCookieHeader({ protocol: 'http' } as FastifyRequest, 'v', 60)).toBe(secure.replace('; Secure', ''));
    expect(sessionCookieHeader({ protocol: 'http' } as FastifyRequest, 'v', 60, true)).toBe(secure);
  });
});
