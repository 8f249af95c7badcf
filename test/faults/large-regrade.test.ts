import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { bearer, call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

// More rows than one INSERT can carry (PostgreSQL takes at most 65,535 parameters; a result row has 9).
const STUDENTS = 8000;

describe(`a regrade of ${STUDENTS.toLocaleString('en-US')} submissions`, () => {
  let api: Api;
  let s: Seed;

  beforeAll(async () => {
    api = await openApi('postgres');
    s = await seedCourse(api.app);
    const db = api.database.store.db;
    // An invented section of 8,000 students, each with one stored submission (the same clean data).
    const [payload] = submissionsFor(['S-001'], 9);
    await sql`insert into students (course_id, section_id, student_id)
      select ${s.course.id}, ${s.sectionA.id}, 'R-' || lpad(n::text, 5, '0') from generate_series(1, ${STUDENTS}) n`.execute(db);
    await sql`insert into submissions (assignment_id, student_row_id, version, payload)
      select ${s.assignment.id}, id, 1, ${JSON.stringify(payload)}::jsonb from students where student_id like 'R-%'`.execute(db);
  }, 120_000);
  afterAll(async () => api?.close());

  it('runs in the background, part by part, with its progress visible, and gives every submission a new result', async () => {
    const started = await call(api.app, 'POST', `/v1/assignments/${s.assignment.id}/regrade`, s.instructorToken, {}, 202);
    // The seeded course's own submissions are none: only the 8,000 invented ones are regraded.
    expect(started.body).toMatchObject({ status: 'running', total: STUDENTS, done: 0 });
    const progressNow = async () => (await call(api.app, 'GET', started.headers.location as string, s.instructorToken, undefined, 200)).body;
    // A part done and others still to do shows on the way (parts of 500: it is seen long before the end).
    const partway = await vi.waitFor(
      async () => {
        const now = await progressNow();
        expect(now).toMatchObject({ status: 'running', total: STUDENTS });
        expect(now.done).toBeGreaterThan(0);
        return now;
      },
      { timeout: 100_000, interval: 20 },
    );
    expect(partway.done).toBeLessThan(STUDENTS);
    const progress = await vi.waitFor(
      async () => {
        const now = await progressNow();
        expect(now.status).not.toBe('running');
        return now;
      },
      { timeout: 100_000, interval: 100 },
    );
    expect(progress).toMatchObject({ status: 'finished', total: STUDENTS, done: STUDENTS });
    const { rows } = await sql<{ n: number }>`select count(*)::int as n from results r join submissions su on su.id = r.submission_id
      join students st on st.id = su.student_row_id where st.student_id like 'R-%' and r.status = 'checked'`.execute(api.database.store.db);
    expect(rows[0].n).toBe(STUDENTS);
    const one = await api.app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, headers: bearer(s.taAToken) });
    expect(one.statusCode).toBe(200);
  }, 240_000);
});
