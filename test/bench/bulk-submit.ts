import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.ts';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { ADMIN_TOKEN, call, testConfig } from '../support/api-fixture.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { assignmentSettings, generateAssignment, generateSubmission } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { openTestDatabase } from '../support/test-database.ts';

/**
 * One bulk submission through the HTTP layer: a section of 500 students (S-0001..S-0500, an invented
 * roster added in one request), 500 clean generated submissions (4 runs x 16 readings), and ONE
 * `app.inject` POST of all 500 that grades and stores them in one transaction. On the local PostgreSQL
 * server (DATABASE_URL, default postgres://postgres@127.0.0.1:5432/postgres; a fresh database, dropped
 * afterwards) and on the embedded engine (PGlite, in memory). Figures are printed, never asserted.
 */
const STUDENTS = 500;
const DEFAULT_DATABASE_URL = 'postgres://postgres@127.0.0.1:5432/postgres';
const TARGET_SECONDS = 2;

export interface BulkSubmitFigures {
  engine: 'postgres' | 'pglite';
  seconds: number;
  submissionsPerSecond: number;
  /** The longest the event loop went without a turn during the request (parsing the body, the database). */
  longestStallMs: number;
}

export const ids = Array.from({ length: STUDENTS }, (_, i) => `S-${String(i + 1).padStart(4, '0')}`);

export function cleanSubmissions() {
  const random = seededRandom(500);
  const settings = generateAssignment(random, { fitModel: 'origin' });
  return ids.map((studentId, i) => ({ ...generateSubmission(random, settings, i + 1), studentId }));
}

/** A course with one section of 500 students and one assignment; returns the submission URL and a token. */
export async function seed(app: FastifyInstance) {
  const course = (await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Bulk bench (invented)' }, 201)).body;
  const instructor = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, ADMIN_TOKEN, { handle: 'instructor-1', role: 'instructor' }, 201)).body;
  const token = (await call(app, 'POST', `/v1/staff/${instructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token as string;
  const section = (await call(app, 'POST', `/v1/courses/${course.id}/sections`, token, { name: 'Big section' }, 201)).body;
  const roster = await call(app, 'POST', `/v1/sections/${section.id}/roster`, token, { students: ids.map((studentId) => ({ studentId })) }, 200);
  if (roster.body.added !== STUDENTS) throw new Error(`roster: added ${roster.body.added}, expected ${STUDENTS}`);
  const settings = assignmentSettings({ fitModel: 'origin' });
  const assignment = (await call(app, 'POST', `/v1/courses/${course.id}/assignments`, token, { title: 'Acid catalysis (invented)', settings }, 201)).body;
  return { url: `/v1/sections/${section.id}/assignments/${assignment.id}/submissions`, token, settings };
}

async function benchOn(engine: 'postgres' | 'pglite'): Promise<BulkSubmitFigures> {
  const database = await openTestDatabase(engine);
  let app: FastifyInstance | undefined;
  try {
    app = await buildApp({ config: testConfig, store: database.store });
    const { url, token } = await seed(app);
    const submissions = cleanSubmissions();
    // Start the app's workers and warm their code paths, so the timed request is not a JIT measurement.
    const headers = { authorization: `Bearer ${token}` };
    await Promise.all([0, 1, 2, 3].map((i) => app!.inject({ method: 'POST', url, headers, payload: submissions.slice(10 * i, 10 * i + 10) })));

    const delay = monitorEventLoopDelay({ resolution: 5 });
    delay.enable();
    const start = process.hrtime.bigint();
    const res = await app.inject({ method: 'POST', url, headers, payload: submissions });
    const seconds = Number(process.hrtime.bigint() - start) / 1e9;
    delay.disable();

    if (res.statusCode !== 201) throw new Error(`bulk submit on ${engine}: ${res.statusCode} ${res.body.slice(0, 500)}`);
    const body = res.json() as { stored: Array<{ status: string }>; rejected: unknown[] };
    if (body.stored.length !== STUDENTS || body.rejected.length !== 0 || body.stored.some((s) => s.status !== 'checked')) {
      throw new Error(`bulk submit on ${engine}: stored ${body.stored.length}, rejected ${body.rejected.length}`);
    }
    return { engine, seconds, submissionsPerSecond: STUDENTS / seconds, longestStallMs: delay.max / 1e6 };
  } finally {
    await app?.close();
    await database.close();
  }
}

function print(f: BulkSubmitFigures, label: string): void {
  console.log(
    `bulk submit (${label}): ${STUDENTS} submissions in one POST in ${f.seconds.toFixed(2)} s wall ` +
      `(${Math.round(f.submissionsPerSecond).toLocaleString('en-US')} submissions/s; graded and stored in one transaction; ` +
      `4 runs x 16 readings; target <= ${TARGET_SECONDS} s); longest event-loop stall ${f.longestStallMs.toFixed(0)} ms (checking runs in workers)`,
  );
}

export async function benchBulkSubmit(): Promise<BulkSubmitFigures[]> {
  process.env.DATABASE_URL ||= DEFAULT_DATABASE_URL;
  const postgres = await benchOn('postgres');
  print(postgres, 'PostgreSQL server');
  const pglite = await benchOn('pglite');
  print(pglite, 'embedded PGlite, in memory');
  return [postgres, pglite];
}
