import { createHash } from 'node:crypto';
import type { FastifyRequest } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callerOf } from '../../server/http/caller.ts';
import { SESSION_COOKIE } from '../../server/http/session-cookie.ts';
import { ADMIN_TOKEN, call, openApi, seedCourse, testConfig, type Api, type Seed } from '../support/api-fixture.ts';

/** Crockford's base32 alphabet, written out here from its published table: no I, L, O or U. */
const CROCKFORD = /^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/;

/** A student's sign-in with an access code: the cookie, the one answer for every code that opens nothing, the rate limit, and staff routes closed. */
describe('student sign-in with an access code', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  const issue = async (studentIds: string[], sectionId = s.sectionA.id) =>
    (await call(api.app, 'POST', `/v1/sections/${sectionId}/access-codes`, s.instructorToken, { studentIds }, 201)).body.codes as Array<{ studentId: string; displayName: string | null; code: string }>;
  const signIn = (code: string, remoteAddress?: string) => api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code }, ...(remoteAddress ? { remoteAddress } : {}) });
  const session = async (code: string) => {
    const res = await signIn(code);
    expect(res.statusCode, res.body).toBe(201);
    return { cookie: String(res.headers['set-cookie']).split(';')[0], csrf: res.json().csrfToken as string };
  };
  const probe = async (cookie: string) => (await api.app.inject({ method: 'GET', url: '/v1/session', headers: { cookie } })).json();

  it('signs a student in with an HttpOnly cookie holding a student session, whatever the case, dashes, spaces or look-alikes typed', async () => {
    const [{ code }] = await issue(['S-001']);
    expect(code).toMatch(CROCKFORD);
    const res = await signIn(code);
    expect(res.statusCode).toBe(201);
    const setCookie = String(res.headers['set-cookie']);
    expect(setCookie).toMatch(new RegExp(`^${SESSION_COOKIE}=st_[A-Za-z0-9_-]{40,}; Path=/; HttpOnly; SameSite=Strict; Max-Age=28800$`));
    expect(setCookie).not.toContain(code);
    expect(await probe(setCookie.split(';')[0])).toEqual({ signedIn: true, as: 'student' });
    // Typed as a person might (hand-worked): lower case, no dashes, spaces, 0 as O and 1 as I or L.
    const typed = ` ${code.replace(/-/g, ' ').toLowerCase().replace(/0/g, 'o').replace(/1/g, 'l')} `;
    expect((await signIn(typed)).statusCode).toBe(201);
  });

  it('stores only the SHA-256 of the code, and lists when it was issued, never the code', async () => {
    const [{ code }] = await issue(['S-002']);
    const hash = createHash('sha256').update(code.replace(/-/g, '')).digest('hex');
    const rows = await api.database.store.db.selectFrom('access_codes').selectAll().where('revoked_at', 'is', null).execute();
    expect(rows.map((r) => r.code_hash)).toContain(hash);
    expect(JSON.stringify(rows)).not.toContain(code.replace(/-/g, ''));
    const listed = await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/access-codes`, s.taAToken, undefined, 200);
    expect(listed.body.map((r: { studentId: string }) => r.studentId)).toEqual(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006']);
    expect(listed.body.find((r: { studentId: string }) => r.studentId === 'S-002').issuedAt).toEqual(expect.any(String));
    expect(listed.body.find((r: { studentId: string }) => r.studentId === 'S-003').issuedAt).toBeNull();
    expect(JSON.stringify(listed.body)).not.toContain(code);
  });

  it('answers a wrong, revoked, replaced or withdrawn student\'s code exactly as a made-up one', async () => {
    const madeUp = await signIn('ZZZZ-ZZZZ-ZZZZ');
    expect(madeUp.statusCode).toBe(401);
    const [{ code: revoked }] = await issue(['S-003']);
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes/revoke`, s.instructorToken, { studentIds: ['S-003'] }, 200);
    const [{ code: replaced }] = await issue(['S-004']);
    const [{ code: current }] = await issue(['S-004']);
    const [{ code: withdrawn }] = await issue(['S-005']);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-005`, s.instructorToken, { status: 'withdrawn' }, 200);
    const wrong = `${current.slice(0, -1)}${current.endsWith('0') ? '1' : '0'}`;
    for (const code of [revoked, replaced, withdrawn, wrong, 'not a code at all']) {
      const res = await signIn(code);
      expect([res.statusCode, res.json()], code).toEqual([madeUp.statusCode, madeUp.json()]);
    }
    expect((await signIn(current)).statusCode).toBe(201);
    // Enrolled again, the student is still without a code until one is issued anew.
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-005`, s.instructorToken, { status: 'enrolled' }, 200);
    expect((await signIn(withdrawn)).statusCode).toBe(401);
  });

  it('revoking a code or withdrawing the student ends the sessions it opened', async () => {
    const [{ code }] = await issue(['S-006']);
    const open = await session(code);
    expect(await probe(open.cookie)).toEqual({ signedIn: true, as: 'student' });
    expect((await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes/revoke`, s.instructorToken, { studentIds: ['s-006'] }, 200)).body).toEqual({ revoked: 1 });
    expect(await probe(open.cookie)).toEqual({ signedIn: false, as: null });
    const [{ code: again }] = await issue(['S-006']);
    const reopened = await session(again);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-006`, s.instructorToken, { status: 'removed' }, 200);
    expect(await probe(reopened.cookie)).toEqual({ signedIn: false, as: null });
    expect(await api.database.store.db.selectFrom('access_codes').select('id').where('revoked_at', 'is', null).where('student_row_id', 'in', (eb) => eb.selectFrom('students').select('id').where('student_id', '=', 'S-006')).execute()).toEqual([]);
  });

  it('issues codes to every enrolled student of the section when none are named, each code different', async () => {
    const res = await call(api.app, 'POST', `/v1/sections/${s.sectionB.id}/access-codes`, s.instructorToken, {}, 201);
    const codes = res.body.codes as Array<{ studentId: string; code: string }>;
    expect(codes.map((c) => c.studentId)).toEqual(['S-101', 'S-102', 'S-103']);
    expect(new Set(codes.map((c) => c.code)).size).toBe(3);
    for (const c of codes) expect(c.code).toMatch(CROCKFORD);
  });

  it('names the student id that is not on the roster or not enrolled, and issues nothing', async () => {
    const before = await api.database.store.db.selectFrom('access_codes').select('id').execute();
    const res = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes`, s.instructorToken, { studentIds: ['S-001', 'S-999', 'S-101'] });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { path: 'body.studentIds[1]', message: "S-999 is not on this section's roster" },
      { path: 'body.studentIds[2]', message: "S-101 is not on this section's roster" },
    ]);
    expect(await api.database.store.db.selectFrom('access_codes').select('id').execute()).toEqual(before);
    const empty = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes/revoke`, s.instructorToken, { studentIds: [] });
    expect([empty.status, empty.body.error.details[0].path]).toEqual([400, 'body.studentIds']);
  });

  it('refuses the admin token, which is no staff member to record as the issuer', async () => {
    const res = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes`, ADMIN_TOKEN, { studentIds: ['S-001'] });
    expect(res.status).toBe(403);
  });

  it('answers a student session on staff routes as on a missing route', async () => {
    const [{ code }] = await issue(['S-001']);
    const { cookie } = await session(code);
    const missing = await api.app.inject({ method: 'GET', url: '/v1/sections/999999/roster', headers: { cookie } });
    expect(missing.statusCode).toBe(404);
    for (const url of ['/v1/me', '/v1/courses', `/v1/sections/${s.sectionA.id}/roster`, `/v1/sections/${s.sectionA.id}/access-codes`, `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`]) {
      const res = await api.app.inject({ method: 'GET', url, headers: { cookie } });
      expect([res.statusCode, res.json()], url).toEqual([404, missing.json()]);
    }
  });

  it('needs the page\'s CSRF token for a change under a student cookie, and signs out with it', async () => {
    const [{ code }] = await issue(['S-002']);
    const { cookie, csrf } = await session(code);
    const asRequest = (headers: Record<string, string>) => ({ method: 'POST', headers: { cookie, ...headers } }) as unknown as FastifyRequest;
    await expect(callerOf(asRequest({}), api.database.store, testConfig)).rejects.toMatchObject({ code: 'forbidden' });
    await expect(callerOf(asRequest({ 'x-csrf-token': 'not-the-token' }), api.database.store, testConfig)).rejects.toMatchObject({ code: 'forbidden' });
    expect(await callerOf(asRequest({ 'x-csrf-token': csrf }), api.database.store, testConfig)).toEqual({ kind: 'student', studentRowId: expect.any(Number), studentId: 'S-002', courseId: s.course.id, sectionId: s.sectionA.id });
    const forged = await api.app.inject({ method: 'DELETE', url: '/v1/session', headers: { cookie } });
    expect(forged.statusCode).toBe(403);
    expect(await probe(cookie)).toEqual({ signedIn: true, as: 'student' });
    const out = await api.app.inject({ method: 'DELETE', url: '/v1/session', headers: { cookie, 'x-csrf-token': csrf } });
    expect(out.statusCode).toBe(204);
    expect(String(out.headers['set-cookie'])).toContain('Max-Age=0');
    expect(await probe(cookie)).toEqual({ signedIn: false, as: null });
  });
});

describe('the access-code sign-in is rate-limited per address', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    // Behind one proxy, as docker compose runs the service: the client is the proxy's X-Forwarded-For.
    api = await openApi('postgres', { ...testConfig, codeTriesPerMinute: 3, proxyHops: 1 });
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('answers 429 with the common error body after the configured tries from one client, even for the right code; another client of the same proxy may still try', async () => {
    const { code } = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes`, s.instructorToken, { studentIds: ['S-001'] }, 201)).body.codes[0];
    const proxy = '10.0.0.2';
    const tryCode = (c: string, client = '203.0.113.7') => api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code: c }, remoteAddress: proxy, headers: { 'x-forwarded-for': client } });
    const statuses = [];
    for (let i = 0; i < 3; i++) statuses.push((await tryCode('AAAA-AAAA-AAAA')).statusCode);
    expect(statuses).toEqual([401, 401, 401]);
    const limited = await tryCode(code);
    expect(limited.statusCode).toBe(429);
    expect(limited.json()).toEqual({ error: { code: 'too-many-requests', message: expect.stringContaining('too many tries from this address') } });
    expect(limited.headers['retry-after']).toBeDefined();
    expect((await tryCode(code, '198.51.100.4')).statusCode).toBe(201);
    // Staff sign-in and other routes are not counted.
    for (let i = 0; i < 5; i++) expect((await api.app.inject({ method: 'GET', url: '/v1/session', remoteAddress: '203.0.113.7' })).statusCode).toBe(200);
  });
});
