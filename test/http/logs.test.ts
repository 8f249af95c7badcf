import { PassThrough } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import type { Grader } from '../../server/grading/grader.ts';
import { bearer, openApi, seedCourse, submissionsFor, testConfig, type Api, type Seed } from '../support/api-fixture.ts';

describe('the log of an unexpected error', () => {
  let api: Api;
  let s: Seed;
  const lines: string[] = [];

  beforeAll(async () => {
    api = await openApi('pglite');
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('keeps the error\'s class, code and place, never its text, a body or a student id (a 500 to the client, with no internals)', async () => {
    // A grader that fails the way a database can: its message quotes a row with a student id in it.
    const failing: Grader = {
      check: async () => {
        throw Object.assign(new Error('Key (student_id)=(S-001) payload {"label":"secret text"} violates something'), { code: 'XX000', detail: 'Failing row contains (S-001, secret text)' });
      },
      renderSheet: async () => Buffer.alloc(0),
      renderSummary: async () => Buffer.alloc(0),
      sectionSignals: async () => ({ pairs: [], groups: [], smooth: [] }),
      renderSheets: async function* () {},
    };
    const stream = new PassThrough();
    stream.on('data', (chunk) => lines.push(...String(chunk).split('\n').filter(Boolean)));
    const app = await buildApp({ config: { ...testConfig, logLevel: 'info' }, store: api.database.store, grader: failing, logger: { stream } });
    const res = await app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: bearer(s.taAToken), payload: submissionsFor(['S-001']) });
    await app.close();
    expect(res.statusCode).toBe(500);
    expect(res.json()).toEqual({ error: { code: 'internal', message: 'internal error' } });
    const logged = lines.join('\n');
    const entry = lines.map((l) => JSON.parse(l) as { msg?: string; error?: { name: string; code?: string; at: string[] } }).find((l) => l.msg === 'unhandled error');
    expect(entry?.error).toMatchObject({ name: 'Error', code: 'XX000' });
    expect(entry?.error?.at.length).toBeGreaterThan(0);
    for (const secret of ['S-001', 'secret text', 'Failing row', 'violates', s.taAToken]) expect(logged).not.toContain(secret);
  });
});

describe('the request log', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi('pglite');
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('names no student id on any line, whatever URL carried one (roster, history, query, unknown or malformed paths)', async () => {
    const lines: string[] = [];
    const stream = new PassThrough();
    stream.on('data', (chunk) => lines.push(...String(chunk).split('\n').filter(Boolean)));
    const app = await buildApp({ config: { ...testConfig, logLevel: 'trace' }, store: api.database.store, logger: { stream } });
    const requests = [
      { method: 'PUT' as const, url: `/v1/sections/${s.sectionA.id}/roster/S-001`, payload: { status: 'withdrawn' } },
      { method: 'PUT' as const, url: `/v1/sections/${s.sectionA.id}/roster/S-002`, payload: { status: 'sideways' } },
      { method: 'GET' as const, url: `/v1/sections/${s.sectionA.id}/students/S-003/history?assignmentId=${s.assignment.id}` },
      { method: 'GET' as const, url: `/v1/sections/${s.sectionA.id}/roster?student=S-004` },
      { method: 'GET' as const, url: `/v1/sections/${s.sectionA.id}/pupils/S-005` },
      { method: 'GET' as const, url: `/v1/sections/${s.sectionA.id}/students/S-006%/history` },
      { method: 'GET' as const, url: `/v1/sections/${s.sectionA.id}/students/S-101${'x'.repeat(120)}/history` },
    ];
    const statuses: number[] = [];
    for (const r of requests) statuses.push((await app.inject({ ...r, headers: bearer(s.instructorToken) })).statusCode);
    await app.close();
    // Each request was answered (a success, a refusal or a miss), so each was logged on its way in and out.
    expect(statuses).toEqual([200, 400, 404, 200, 404, 400, 400]);
    const logged = lines.join('\n');
    expect(lines.filter((l) => l.includes('incoming request')).length).toBe(requests.length);
    // The numeric section id is kept: it names no person and helps find a request again.
    expect(logged).toContain(`/v1/sections/${s.sectionA.id}/roster/:studentId`);
    for (const id of ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006', 'S-101']) expect(logged).not.toContain(id);
  });
});

