import type { FastifyInstance } from 'fastify';
import { sql, type Kysely } from 'kysely';
import { buildApp } from '../../server/app.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { assignmentSettings, generateAssignment, generateSubmission } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import type { Database } from '../../server/store/database.ts';
import { storeGraded } from '../../server/store/submissions.ts';
import { ADMIN_TOKEN, bearer, call, testConfig } from '../support/api-fixture.ts';
import { openTestDatabase } from '../support/test-database.ts';

/**
 * A TA's pages while others upload, on a PostgreSQL server (DATABASE_URL, default the local one; a
 * fresh database, dropped afterwards): 30 invented sections of 1,500 students with one graded version
 * each (45,000 submissions; the first section graded through the service, the others stored as copies
 * of its rows through the store, which is what grading them would store), the first section released.
 * Then for RP_LOAD_SECONDS (default 60) 4 uploaders each send batches of 50 new versions to a section
 * of their own, while 5 readers each loop over a TA's GETs: the first section's results page, one
 * submission, a student's history, the assignment and `me`. Prints the p95 of every GET and of the
 * results page beside the goal (300 ms). Printed, not asserted.
 */
const SECTIONS = 30;
const PER_SECTION = 1500;
const UPLOADERS = 4;
const READERS = 5;
const PER_UPLOAD = 50;
const GOAL_MS = 300;
const DEFAULT_DATABASE_URL = 'postgres://postgres@127.0.0.1:5432/postgres';

const idOf = (section: number, i: number) => `T${String(section).padStart(2, '0')}-${String(i + 1).padStart(4, '0')}`;

export interface LoadFigures {
  seconds: number;
  uploads: number;
  gets: number;
  getP50: number;
  getP95: number;
  resultsP50: number;
  resultsP95: number;
  resultsIdle: number;
}

const quantile = (values: number[], q: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
};

/** The course above, stored through `app` and `db`; returns what the load sends and reads. */
export async function seedLoad(app: FastifyInstance, db: Kysely<Database>) {
  const course = (await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Load bench (invented)' }, 201)).body;
  const instructor = (await call(app, 'POST', `/v1/courses/${course.id}/staff`, ADMIN_TOKEN, { handle: 'instructor-1', role: 'instructor' }, 201)).body;
  const token = (await call(app, 'POST', `/v1/staff/${instructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token as string;
  const settings = assignmentSettings({ fitModel: 'origin' });
  const assignment = (await call(app, 'POST', `/v1/courses/${course.id}/assignments`, token, { title: 'Load (invented)', settings }, 201)).body;
  const sections: number[] = [];
  for (let s = 0; s < SECTIONS; s++) {
    const section = (await call(app, 'POST', `/v1/courses/${course.id}/sections`, token, { name: `Section ${s + 1}` }, 201)).body;
    sections.push(section.id);
    const students = Array.from({ length: PER_SECTION }, (_, i) => ({ studentId: idOf(s, i) }));
    await call(app, 'POST', `/v1/sections/${section.id}/roster`, token, { students }, 200);
  }
  const random = seededRandom(27);
  const generated = generateAssignment(random, { fitModel: 'origin' });
  const submissionsOf = (section: number, from: number, count: number) =>
    Array.from({ length: count }, (_, i) => ({ ...generateSubmission(random, generated, from + i + 1), studentId: idOf(section, (from + i) % PER_SECTION) }));
  const target = `/v1/sections/${sections[0]}/assignments/${assignment.id}`;
  for (let from = 0; from < PER_SECTION; from += 500) await call(app, 'POST', `${target}/submissions`, token, submissionsOf(0, from, 500), 201);
  await call(app, 'POST', `${target}/release`, token, undefined, 200);

  // The other sections: the first section's stored rows again, for their own students.
  const { rows: graded } = await sql<{ suffix: string; payload: string; engine_version: string; status: string; score: number | null; max_score: number; refit: string | null; findings: string; page_summary: string | null; settings_version: number; settings: unknown }>`
    select right(st.student_id, 4) as suffix, sub.payload::text as payload, r.engine_version, r.status, r.score, r.max_score, r.refit::text as refit,
      r.findings::text as findings, r.page_summary::text as page_summary, r.settings_version, r.settings
    from submissions sub join students st on st.id = sub.student_row_id join results r on r.submission_id = sub.id
    where st.section_id = ${sections[0]} order by st.student_id`.execute(db);
  const staffId = Number(instructor.id);
  for (const sectionId of sections.slice(1)) {
    const { rows: students } = await sql<{ id: number; suffix: string }>`select id, right(student_id, 4) as suffix from students where section_id = ${sectionId}`.execute(db);
    const rowOf = new Map(students.map((s) => [s.suffix, s.id]));
    await db.transaction().execute((trx) =>
      storeGraded(trx, assignment.id, staffId, { settings: graded[0].settings, settingsVersion: graded[0].settings_version }, graded.map((g) => ({
        studentRowId: rowOf.get(g.suffix)!,
        payloadJson: g.payload,
        result: { engineVersion: g.engine_version, status: g.status, score: g.score, maxScore: g.max_score, refitJson: g.refit, findingsJson: g.findings, pageSummaryJson: g.page_summary ?? undefined },
      }))),
    );
  }
  await sql`analyze`.execute(db);

  const { rows: some } = await sql<{ id: number }>`select sub.id from submissions sub join students st on st.id = sub.student_row_id where st.section_id = ${sections[0]} order by sub.id limit 1`.execute(db);
  const gets = [
    { name: 'results', url: `${target}/results` },
    { name: 'submission', url: `/v1/submissions/${some[0].id}` },
    { name: 'history', url: `/v1/sections/${sections[0]}/students/${idOf(0, 0)}/history` },
    { name: 'assignment', url: `/v1/assignments/${assignment.id}` },
    { name: 'me', url: '/v1/me' },
  ];
  return { token, sections, assignment, target, gets, submissionsOf };
}

export async function benchResultsUnderLoad(): Promise<LoadFigures> {
  process.env.DATABASE_URL ||= DEFAULT_DATABASE_URL;
  const seconds = Number(process.env.RP_LOAD_SECONDS ?? 60);
  const database = await openTestDatabase('postgres');
  const app = await buildApp({ config: { ...testConfig, bodyLimitBytes: 20 * 1024 * 1024 }, store: database.store });
  try {
    const { token, sections, assignment, gets, submissionsOf } = await seedLoad(app, database.store.db);
    const idleStart = performance.now();
    await call(app, 'GET', gets[0].url, token, undefined, 200);
    const resultsIdle = performance.now() - idleStart;

    const latencies: Record<string, number[]> = Object.fromEntries(gets.map((g) => [g.name, []]));
    let uploads = 0;
    const until = performance.now() + seconds * 1000;
    const uploaders = Array.from({ length: UPLOADERS }, async (_, u) => {
      const section = 1 + u;
      for (let from = 0; performance.now() < until; from += PER_UPLOAD) {
        await call(app, 'POST', `/v1/sections/${sections[section]}/assignments/${assignment.id}/submissions`, token, submissionsOf(section, from, PER_UPLOAD), 201);
        uploads++;
      }
    });
    const readers = Array.from({ length: READERS }, async (_, r) => {
      for (let i = r; performance.now() < until; i++) {
        const get = gets[i % gets.length];
        const start = performance.now();
        await call(app, 'GET', get.url, token, undefined, 200);
        latencies[get.name].push(performance.now() - start);
      }
    });
    await Promise.all([...uploaders, ...readers]);
    const all = Object.values(latencies).flat();
    return {
      seconds,
      uploads,
      gets: all.length,
      getP50: quantile(all, 0.5),
      getP95: quantile(all, 0.95),
      resultsP50: quantile(latencies.results, 0.5),
      resultsP95: quantile(latencies.results, 0.95),
      resultsIdle,
    };
  } finally {
    await app.close();
    await database.close();
  }
}

export function printResultsUnderLoad(f: LoadFigures): void {
  const verdict = (ms: number) => (ms < GOAL_MS ? 'met' : 'not met');
  console.log(
    `a TA's pages under load (PostgreSQL server; ${(SECTIONS * PER_SECTION).toLocaleString('en-US')} submissions stored, a section of ${PER_SECTION.toLocaleString('en-US')}; ` +
      `${UPLOADERS} uploaders of ${PER_UPLOAD} for ${f.seconds} s, ${f.uploads} batches stored; ${READERS} GET loops, ${f.gets} GETs): ` +
      `GET p95 ${f.getP95.toFixed(0)} ms (median ${f.getP50.toFixed(0)}), goal < ${GOAL_MS} ms: ${verdict(f.getP95)}; ` +
      `results page p95 ${f.resultsP95.toFixed(0)} ms (median ${f.resultsP50.toFixed(0)}), goal < ${GOAL_MS} ms: ${verdict(f.resultsP95)}; ` +
      `results page idle before the load ${f.resultsIdle.toFixed(0)} ms`,
  );
}

// Run alone: `npx tsx test/bench/results-under-load.ts`.
if (import.meta.url === `file://${process.argv[1]}`) printResultsUnderLoad(await benchResultsUnderLoad());
