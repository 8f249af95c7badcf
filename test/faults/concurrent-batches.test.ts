import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

// Concurrent requests on a PostgreSQL server (the pool's connections run them side by side) where one
// is given; on the embedded engine they run one after another, and the same answers must come back.
describe('batches sent at the same time', () => {
  let api: Api;
  let s: Seed;
  const url = () => `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`;
  const post = (payload: unknown, headers: Record<string, string> = {}) =>
    api.app.inject({ method: 'POST', url: url(), headers: { ...bearer(s.taAToken), ...headers }, payload: payload as object });

  beforeAll(async () => {
    api = await openApi('postgres');
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('two TAs uploading overlapping students at once: both batches land, each student\'s versions counted without a gap or a repeat', async () => {
    const rounds = 4;
    const answers = await Promise.all(
      Array.from({ length: rounds }, (_, r) => [post(submissionsFor(['S-001', 'S-002', 'S-003', 'S-004'], 10 + r)), post(submissionsFor(['S-003', 'S-004', 'S-005', 'S-006'], 20 + r))]).flat(),
    );
    for (const res of answers) expect(res.statusCode, res.body).toBe(201);
    const { rows } = await sql<{ student: string; versions: number[] }>`
      select st.student_id as student, array_agg(su.version order by su.version) as versions
      from submissions su join students st on st.id = su.student_row_id
      where su.assignment_id = ${s.assignment.id} group by st.student_id order by st.student_id`.execute(api.database.store.db);
    const count = (n: number) => Array.from({ length: n }, (_, i) => i + 1);
    expect(rows).toEqual([
      { student: 'S-001', versions: count(rounds) },
      { student: 'S-002', versions: count(rounds) },
      { student: 'S-003', versions: count(2 * rounds) },
      { student: 'S-004', versions: count(2 * rounds) },
      { student: 'S-005', versions: count(rounds) },
      { student: 'S-006', versions: count(rounds) },
    ]);
  }, 60_000);

  it('20 identical requests with one Idempotency-Key: the batch is stored once, and every answer is the first one', async () => {
    const batch = submissionsFor(['S-001', 'S-002'], 99);
    const headers = { 'idempotency-key': 'upload-2026-12-02-section-a' };
    const before = await sql<{ n: number }>`select count(*)::int as n from submissions`.execute(api.database.store.db);
    const answers = await Promise.all(Array.from({ length: 20 }, () => post(batch, headers)));
    for (const res of answers) expect(res.statusCode, res.body).toBe(201);
    expect(new Set(answers.map((res) => res.body)).size).toBe(1);
    expect(answers.filter((res) => res.headers['idempotent-replayed'] === 'true')).toHaveLength(19);
    const after = await sql<{ n: number }>`select count(*)::int as n from submissions`.execute(api.database.store.db);
    expect(after.rows[0].n - before.rows[0].n).toBe(2);
  }, 60_000);

  it('an Idempotency-Key longer than 200 characters is refused, naming the header, never cut short', async () => {
    const res = await post(submissionsFor(['S-001'], 5), { 'idempotency-key': 'k'.repeat(201) });
    expect(res.statusCode).toBe(400);
    expect(res.json().error.details).toEqual([{ path: 'headers.idempotency-key', message: 'at most 200 characters' }]);
  });
});
