import { sql } from 'kysely';
import { buildApp } from '../../server/app.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { assignmentSettings, generateAssignment, generateSubmission } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { ADMIN_TOKEN, bearer, call, testConfig } from '../support/api-fixture.ts';
import { openTestDatabase } from '../support/test-database.ts';

/**
 * Ten batches of 500 sent at once to the service on a PostgreSQL server (DATABASE_URL, default the
 * local one; a fresh database, dropped afterwards), each for its own 500 students of one invented
 * section, while a TA reloads the section's results every 50 ms. Prints whether every submission was
 * stored exactly once, the wall time, and the results GET's median and 95th-percentile latency (goal:
 * p95 under 300 ms on this 2-core machine). Printed, not asserted.
 */
const BATCHES = 10;
const PER_BATCH = 500;
const DEFAULT_DATABASE_URL = 'postgres://postgres@127.0.0.1:5432/postgres';

export async function benchConcurrentLoad(): Promise<void> {
  process.env.DATABASE_URL ||= DEFAULT_DATABASE_URL;
  const database = await openTestDatabase('postgres');
  const app = await buildApp({ config: { ...testConfig, bodyLimitBytes: 20 * 1024 * 1024 }, store: database.store });
  try {
    const ids = Array.from({ length: BATCHES * PER_BATCH }, (_, i) => `L-${String(i + 1).padStart(5, '0')}`);
    const course = (await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Load bench (invented)' }, 201)).body;
    const instructor = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, ADMIN_TOKEN, { handle: 'instructor-1', role: 'instructor' }, 201)).body;
    const token = (await call(app, 'POST', `/v1/staff/${instructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token as string;
    const section = (await call(app, 'POST', `/v1/courses/${course.id}/sections`, token, { name: 'Big section' }, 201)).body;
    for (let i = 0; i < ids.length; i += 5000) {
      await call(app, 'POST', `/v1/sections/${section.id}/roster`, token, { students: ids.slice(i, i + 5000).map((studentId) => ({ studentId })) }, 200);
    }
    const assignment = (await call(app, 'POST', `/v1/courses/${course.id}/assignments`, token, { title: 'Load (invented)', settings: assignmentSettings({ fitModel: 'origin' }) }, 201)).body;
    const random = seededRandom(77);
    const settings = generateAssignment(random, { fitModel: 'origin' });
    const submissions = ids.map((studentId, i) => ({ ...generateSubmission(random, settings, i + 1), studentId }));
    const url = `/v1/sections/${section.id}/assignments/${assignment.id}`;
    // Warm the workers.
    await app.inject({ method: 'POST', url: `${url}/submissions`, headers: bearer(token), payload: submissions.slice(0, 20) });

    const latencies: number[] = [];
    let loading = true;
    const reader = (async () => {
      while (loading) {
        const start = performance.now();
        const res = await app.inject({ method: 'GET', url: `${url}/results`, headers: bearer(token) });
        if (res.statusCode !== 200) throw new Error(`results: ${res.statusCode}`);
        latencies.push(performance.now() - start);
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
    })();
    const start = performance.now();
    const answers = await Promise.all(
      Array.from({ length: BATCHES }, (_, b) => app.inject({ method: 'POST', url: `${url}/submissions`, headers: bearer(token), payload: submissions.slice(b * PER_BATCH, (b + 1) * PER_BATCH) })),
    );
    const seconds = (performance.now() - start) / 1000;
    loading = false;
    await reader;
    const quietStart = performance.now();
    await app.inject({ method: 'GET', url: `${url}/results`, headers: bearer(token) });
    const quiet = performance.now() - quietStart;
    const { rows } = await sql<{ n: number; students: number }>`
      select count(*)::int as n, count(distinct student_row_id)::int as students from submissions where assignment_id = ${assignment.id} and version = ${1}`.execute(database.store.db);
    const created = answers.filter((a) => a.statusCode === 201).length;
    const sorted = latencies.sort((a, b) => a - b);
    const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
    console.log(
      `load (PostgreSQL server): ${BATCHES} batches of ${PER_BATCH} at once: ${created}/${BATCHES} answered 201 in ${seconds.toFixed(1)} s; ` +
        `${rows[0].n.toLocaleString('en-US')} first versions for ${rows[0].students.toLocaleString('en-US')} students (expected ${ids.length.toLocaleString('en-US')}, each once); ` +
        `results GET during the load: median ${at(0.5).toFixed(0)} ms, p95 ${at(0.95).toFixed(0)} ms over ${sorted.length} requests (goal p95 < 300 ms); ` +
        `afterwards, with ${ids.length.toLocaleString('en-US')} rows and no load: ${quiet.toFixed(0)} ms`,
    );
  } finally {
    await app.close();
    await database.close();
  }
}
