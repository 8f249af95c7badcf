import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.ts';
import type { Config } from '../../server/config.ts';
import { assignmentSettings, generateAssignment, generateSubmission } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { openTestDatabase, type TestDatabase } from './test-database.ts';

export const ADMIN_TOKEN = 'admin-token-for-tests-only-0123456789';

export const testConfig: Config = {
  dataDir: 'memory://',
  host: '127.0.0.1',
  port: 0,
  adminToken: ADMIN_TOKEN,
  bodyLimitBytes: 5 * 1024 * 1024,
  logLevel: 'silent',
  // Tests sign students in many times from one address; the limit itself is tested with a config of its own.
  codeTriesPerMinute: 10_000,
};

export interface Api {
  app: FastifyInstance;
  database: TestDatabase;
  close(): Promise<void>;
}

export async function openApi(engine: 'postgres' | 'pglite' = 'postgres', config: Config = testConfig): Promise<Api> {
  const database = await openTestDatabase(engine);
  const app = await buildApp({ config, store: database.store });
  return {
    app,
    database,
    async close() {
      await app.close();
      await database.close();
    },
  };
}

export const bearer = (token: string) => ({ authorization: `Bearer ${token}` });

/** Sends a request and returns status and parsed JSON; throws with the body when the status is not `expect`. */
export async function call(app: FastifyInstance, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', url: string, token: string | undefined, payload?: unknown, expect?: number) {
  const res = await app.inject({ method, url, headers: token ? bearer(token) : {}, ...(payload === undefined ? {} : { payload: payload as object }) });
  const body = res.headers['content-type']?.toString().includes('json') ? res.json() : res.body;
  if (expect !== undefined && res.statusCode !== expect) throw new Error(`${method} ${url}: expected ${expect}, got ${res.statusCode}: ${res.body}`);
  return { status: res.statusCode, body, headers: res.headers };
}

/**
 * An invented course: sections A and B, an instructor, a TA of each section, a roster of students
 * S-001..S-006 (A) and S-101..S-103 (B), and one assignment of generated settings.
 */
export async function seedCourse(app: FastifyInstance) {
  const course = (await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Physical chemistry lab (invented)' }, 201)).body;
  const instructor = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, ADMIN_TOKEN, { handle: 'instructor-1', role: 'instructor' }, 201)).body;
  const instructorToken = (await call(app, 'POST', `/v1/staff/${instructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token as string;
  const a = (await call(app, 'POST', `/v1/courses/${course.id}/sections`, instructorToken, { name: 'A' }, 201)).body;
  const b = (await call(app, 'POST', `/v1/courses/${course.id}/sections`, instructorToken, { name: 'B' }, 201)).body;
  const taA = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, instructorToken, { handle: 'ta-a', role: 'ta', sectionIds: [a.id] }, 201)).body;
  const taB = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, instructorToken, { handle: 'ta-b', role: 'ta', sectionIds: [b.id] }, 201)).body;
  const taAToken = (await call(app, 'POST', `/v1/staff/${taA.id}/tokens`, instructorToken, undefined, 201)).body.token as string;
  const taBToken = (await call(app, 'POST', `/v1/staff/${taB.id}/tokens`, instructorToken, undefined, 201)).body.token as string;
  const idsA = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'];
  await call(app, 'POST', `/v1/sections/${a.id}/roster`, instructorToken, { students: idsA.map((studentId) => ({ studentId })) }, 200);
  await call(app, 'POST', `/v1/sections/${b.id}/roster`, instructorToken, { students: ['S-101', 'S-102', 'S-103'].map((studentId) => ({ studentId })) }, 200);
  const settings = assignmentSettings({ fitModel: 'origin' });
  const assignment = (await call(app, 'POST', `/v1/courses/${course.id}/assignments`, instructorToken, { title: 'Acid catalysis (invented)', settings }, 201)).body;
  return { course, sectionA: a, sectionB: b, instructor, instructorToken, taA, taB, taAToken, taBToken, assignment, settings };
}

export type Seed = Awaited<ReturnType<typeof seedCourse>>;

/** Clean generated submissions for the given student ids. */
export function submissionsFor(ids: string[], seed = 1) {
  const random = seededRandom(seed);
  const settings = generateAssignment(random, { fitModel: 'origin' });
  return ids.map((id, i) => ({ ...generateSubmission(random, settings, i + 1), studentId: id }));
}

/** Starts a regrade and follows it until it stops; returns where it ended. */
export async function regradeAndWait(app: FastifyInstance, token: string, assignmentId: number, body: unknown = {}) {
  const started = await call(app, 'POST', `/v1/assignments/${assignmentId}/regrade`, token, body, 202);
  let progress = started.body as { regradeId: string; status: string; total: number; done: number };
  while (progress.status === 'running') {
    await new Promise((resolve) => setTimeout(resolve, 20));
    progress = (await call(app, 'GET', `/v1/assignments/${assignmentId}/regrades/${progress.regradeId}`, token, undefined, 200)).body;
  }
  return { started: started.body as typeof progress, location: started.headers.location, progress };
}
