import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { errorCodes } from '../../server/errors.ts';
import type { FastifyInstance } from 'fastify';
import { bearer, seedCourse, testConfig, type Seed } from '../support/api-fixture.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/**
 * Every refusal, the framework's own included, answers in the API's shape `{error: {code, message}}`
 * with a code of the errors module. The cases are what a client can get wrong before any route runs
 * (common practice, no source): a URL that is not percent-encoding, a body past the limit, a media
 * type no parser reads, JSON that does not parse, an unknown path.
 */
const LIMIT = 64 * 1024;

describe('the error shape, the framework\'s errors included', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let s: Seed;
  beforeAll(async () => {
    database = await openTestDatabase('pglite');
    app = await buildApp({ config: { ...testConfig, bodyLimitBytes: LIMIT }, store: database.store });
    s = await seedCourse(app);
  }, 60_000);
  afterAll(async () => {
    await app?.close();
    await database?.close();
  });

  const expectShape = (res: { statusCode: number; body: string; json: () => { error: { code: string; message: string } } }, status: number, code: string, what: string) => {
    expect(res.statusCode, `${what}: ${res.body}`).toBe(status);
    expect(res.json().error, what).toMatchObject({ code, message: expect.any(String) });
    expect(errorCodes, what).toContain(res.json().error.code);
  };

  it.each([
    '/v1/submissions/%',
    '/v1/submissions/%ZZ',
    '/v1/sections/%E0%A4%A/roster',
    '/v1/%',
    '/%ZZ',
    '/web/%',
    '/docs/%ZZ',
  ])('a URL that is not percent-encoding (%s) is a 400 in our shape', async (url) => {
    const res = await app.inject({ method: 'GET', url, headers: bearer(s.instructorToken) });
    expectShape(res, 400, 'invalid-input', url);
  });

  it('a query string value that is not percent-encoding is a 4xx in our shape', async () => {
    const res = await app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/students/S-001/history?assignmentId=%ZZ`, headers: bearer(s.instructorToken) });
    expect(res.statusCode, res.body).toBeGreaterThanOrEqual(400);
    expect(res.statusCode, res.body).toBeLessThan(500);
    expect(errorCodes).toContain(res.json().error.code);
  });

  it('a body past the limit is a 413 payload-too-large', async () => {
    const res = await app.inject({ method: 'POST', url: `/v1/courses/${s.course.id}/sections`, headers: { ...bearer(s.instructorToken), 'content-type': 'application/json' }, payload: JSON.stringify({ name: 'x'.repeat(LIMIT) }) });
    expectShape(res, 413, 'payload-too-large', 'large body');
  });

  it('a media type no parser reads is a 415 unsupported-media-type', async () => {
    const res = await app.inject({ method: 'POST', url: `/v1/courses/${s.course.id}/sections`, headers: { ...bearer(s.instructorToken), 'content-type': 'application/xml' }, payload: '<name>A</name>' });
    expectShape(res, 415, 'unsupported-media-type', 'xml body');
  });

  it('JSON that does not parse is a 400 naming the body', async () => {
    const res = await app.inject({ method: 'POST', url: `/v1/courses/${s.course.id}/sections`, headers: { ...bearer(s.instructorToken), 'content-type': 'application/json' }, payload: '{"name": ' });
    expectShape(res, 400, 'invalid-input', 'malformed JSON');
  });

  it('an unknown path and an unknown method are 404 not-found', async () => {
    expectShape(await app.inject({ method: 'GET', url: '/v1/nowhere' }), 404, 'not-found', 'unknown path');
    expectShape(await app.inject({ method: 'DELETE', url: `/v1/courses/${s.course.id}` }), 404, 'not-found', 'unknown method');
  });

  it('the bearer scheme is read without regard to case (bearer, BEARER), as HTTP auth schemes are', async () => {
    for (const scheme of ['Bearer', 'bearer', 'BEARER', 'bEaReR']) {
      const res = await app.inject({ method: 'GET', url: '/v1/me', headers: { authorization: `${scheme} ${s.taAToken}` } });
      expect(res.statusCode, `${scheme}: ${res.body}`).toBe(200);
      expect(res.json().handle, scheme).toBe('ta-a');
    }
  });

  it('another scheme, or a bearer scheme without a token, is a 401', async () => {
    for (const authorization of [`Basic ${s.taAToken}`, 'Bearer', 'Bearer ', `Bearer${s.taAToken}`]) {
      expectShape(await app.inject({ method: 'GET', url: '/v1/me', headers: { authorization } }), 401, 'unauthenticated', authorization);
    }
  });
});
