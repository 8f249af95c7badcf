import type { FastifyInstance } from 'fastify';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ADMIN_TOKEN, seedCourse, submissionsFor, type Seed } from '../support/api-fixture.ts';
import { parsePrometheusText, samplesOf } from '../support/prometheus-text.ts';
import { overHttp, serve } from '../support/serve-process.ts';
import { scratchDatabase } from '../support/test-database.ts';

/**
 * Three service processes (the compiled `rateproof serve`) on one PostgreSQL database: a regrade of
 * 6,000 submissions started on one, which is then killed (SIGKILL) while it works parts; the other two
 * finish it. Needs a server (DATABASE_URL; CI has one): the embedded database is one process's.
 */
const SERVER = process.env.DATABASE_URL;
const NO_SERVER = !SERVER;
if (NO_SERVER) console.warn('three-process test skipped: it needs a PostgreSQL server in DATABASE_URL (the embedded database is one process\'s)');

const SUBMISSIONS = 6000;
/** The seeded course's section A has 6 roster students who submit through the API; the rest are seeded in bulk. */
const SUBMITTED = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'];
/** A job running longer than this has lost its process and must have been handed to another (the bound). */
const TAKEN_UP_WITHIN_S = 30;

interface Progress {
  regradeId: string;
  total: number;
  done: number;
  status: string;
}

describe.skipIf(NO_SERVER)('three processes on one database: a regrade outlives the process that started it', () => {
  let url: string;
  let drop = async () => {};
  let admin: pg.Client;
  const services: Array<ReturnType<typeof serve>> = [];
  // One worker thread each: three processes share the machine's cores with the database and the test.
  const start = () => {
    const service = serve({ DATABASE_URL: url, RATEPROOF_ADMIN_TOKEN: ADMIN_TOKEN, RATEPROOF_WORKERS: '1' });
    services.push(service);
    return service;
  };

  beforeAll(async () => {
    ({ url, drop } = await scratchDatabase(SERVER!, 'rateproof_jobs'));
    admin = new pg.Client({ connectionString: url });
    await admin.connect();
  });
  afterAll(async () => {
    for (const service of services) if (service.child.exitCode === null && service.child.signalCode === null) service.child.kill('SIGKILL');
    await Promise.all(services.map((service) => service.exited));
    await admin?.end();
    await drop();
  });

  it('the other two finish it: one result per submission under the new settings, releases kept, the same progress from each', async () => {
    const first = start();
    const a = overHttp(await first.listening);
    const s: Seed = await seedCourse(a);
    const auth = (token: string) => ({ authorization: `Bearer ${token}` });

    // Six students submit through the API and a TA releases their results.
    const submitted = await a.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: auth(s.taAToken), payload: submissionsFor(SUBMITTED, 5) });
    expect(submitted.statusCode).toBe(201);
    const release = await a.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, headers: auth(s.taAToken) });
    expect(release.json()).toEqual({ released: SUBMITTED.length, held: 0 });
    const releasesBefore = (await admin.query('select submission_id, result_id from releases order by id')).rows;
    expect(releasesBefore).toHaveLength(SUBMITTED.length);
    const resultsPage = async (app: FastifyInstance) =>
      ((await app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, headers: auth(s.taAToken) })).json() as Array<{ studentId: string; released: boolean; releasedScore: number | null }>)
        .filter((r) => SUBMITTED.includes(r.studentId))
        .map((r) => ({ studentId: r.studentId, released: r.released, releasedScore: r.releasedScore }));
    const shownBefore = await resultsPage(a);

    // The rest seeded straight into the tables (the same clean submission each): 6,000 in all.
    const [payload] = submissionsFor(['B-0'], 9);
    await admin.query(
      `insert into students (course_id, section_id, student_id) select $1, $2, 'B-' || lpad(n::text, 5, '0') from generate_series(1, $3::int) n`,
      [s.course.id, s.sectionA.id, SUBMISSIONS - SUBMITTED.length],
    );
    await admin.query(`insert into submissions (assignment_id, student_row_id, version, payload) select $1, id, 1, $2::jsonb from students where student_id like 'B-%'`, [s.assignment.id, JSON.stringify(payload)]);

    // New settings: the regrade applies them, settings version 2.
    const patched = await a.inject({ method: 'PATCH', url: `/v1/assignments/${s.assignment.id}/settings`, headers: auth(s.instructorToken), payload: { settings: { fitModel: 'intercept' } } });
    expect(patched.json()).toMatchObject({ settingsVersion: 2 });

    const others = [start(), start()];
    const [b, c] = (await Promise.all(others.map((o) => o.listening))).map(overHttp);

    const started = await a.inject({ method: 'POST', url: `/v1/assignments/${s.assignment.id}/regrade`, headers: auth(s.instructorToken), payload: {} });
    expect(started.statusCode).toBe(202);
    const regrade = started.json() as Progress;
    expect(regrade).toMatchObject({ total: SUBMISSIONS, done: 0, status: 'running' });
    const progressOn = async (app: FastifyInstance) => (await app.inject({ method: 'GET', url: `/v1/assignments/${s.assignment.id}/regrades/${regrade.regradeId}`, headers: auth(s.instructorToken) })).json() as Progress;

    // Killed once parts are under way, the first process among them.
    await vi.waitFor(async () => expect((await progressOn(a)).done).toBeGreaterThan(0), { timeout: 120_000, interval: 200 });
    first.child.kill('SIGKILL');
    await first.exited;

    // Followed on the other two: each poll asks B, then C, then B again. C's answer lies between B's
    // two (the same numbers, but for parts stored between the requests); total and regrade always agree.
    const polls: Array<[Progress, Progress, Progress]> = [];
    let longestActive = 0;
    const final = await vi.waitFor(
      async () => {
        const [b1, c1, b2] = [await progressOn(b), await progressOn(c), await progressOn(b)];
        polls.push([b1, c1, b2]);
        const { rows } = await admin.query<{ seconds: number | null }>(`select extract(epoch from max(now() - started_on))::float as seconds from pgboss.job where name = 'regrade-part' and state = 'active'`);
        longestActive = Math.max(longestActive, rows[0].seconds ?? 0);
        expect(b2.status).toBe('finished');
        return b2;
      },
      { timeout: 240_000, interval: 500 },
    );
    for (const [b1, c1, b2] of polls) {
      for (const p of [b1, c1, b2]) expect(p).toMatchObject({ regradeId: regrade.regradeId, total: SUBMISSIONS });
      expect(c1.done).toBeGreaterThanOrEqual(b1.done);
      expect(c1.done).toBeLessThanOrEqual(b2.done);
    }
    expect(final).toMatchObject({ total: SUBMISSIONS, done: SUBMISSIONS, status: 'finished' });
    expect(await progressOn(c)).toEqual(final);
    // No part stayed with the dead process longer than the bound: it was expired and taken up again.
    expect(longestActive).toBeLessThan(TAKEN_UP_WITHIN_S);

    // Every submission has exactly one result under settings version 2.
    const { rows: counts } = await admin.query<{ submissions: number; once: number }>(
      `select count(*)::int as submissions, count(*) filter (where n = 1)::int as once
       from (select su.id, (select count(*) from results r where r.submission_id = su.id and r.settings_version = 2) as n
             from submissions su where su.assignment_id = $1) per`,
      [s.assignment.id],
    );
    expect(counts[0]).toEqual({ submissions: SUBMISSIONS, once: SUBMISSIONS });

    // Released results stay released: the same releases naming the same results, shown as before.
    expect((await admin.query('select submission_id, result_id from releases order by id')).rows).toEqual(releasesBefore);
    expect(await resultsPage(b)).toEqual(shownBefore);

    // Both survivors worked parts.
    for (const app of [b, c]) {
      const text = (await app.inject({ method: 'GET', url: '/metrics' })).body;
      expect(samplesOf(parsePrometheusText(text), 'rateproof_job_duration_seconds_count', { queue: 'regrade-part', outcome: 'completed' })[0]?.value).toBeGreaterThan(0);
    }
    console.log(`three processes: ${polls.length} polls after the kill; longest a part stayed active: ${longestActive.toFixed(1)} s`);
  }, 420_000);
});
