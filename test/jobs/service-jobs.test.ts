import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { CLEANUP, IDEMPOTENCY_DAYS } from '../../server/grading/service-jobs.ts';
import { call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/** The passback stub and the scheduled cleanup, worked by the service's own queue. */
describe('passback and cleanup jobs', () => {
  let api: Api;
  let s: Seed;

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 120_000);
  afterAll(async () => api?.close());

  it('a release queues a passback that records each released score, as the results page shows it', async () => {
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001', 'S-002'], 4), 201);
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, s.taAToken, undefined, 200);
    const page = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, s.taAToken, undefined, 200)).body as Array<{ studentId: string; releasedScore: number | null; maxScore: number | null; released: boolean }>;
    const shown = page.filter((r) => r.released).map((r) => ({ studentId: r.studentId, score: r.releasedScore, maxScore: r.maxScore }));
    expect(shown.map((r) => r.studentId)).toEqual(['S-001', 'S-002']);
    const records = await vi.waitFor(
      async () => {
        const { rows } = await sql<{ grades: Array<{ studentId: string; score: number | null; maxScore: number }> }>`select grades from passback_records where assignment_id = ${s.assignment.id}`.execute(api.database.store.db);
        expect(rows).toHaveLength(1);
        return rows;
      },
      { timeout: 30_000, interval: 200 },
    );
    expect(records[0].grades.map(({ studentId, score, maxScore }) => ({ studentId, score, maxScore }))).toEqual(shown);
    // A release with nothing new queues nothing.
    expect((await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, s.taAToken, undefined, 200)).body).toEqual({ released: 0, held: 0 });
  });

  it('deletes expired sessions and idempotency keys older than the days they are kept, and keeps the rest', async () => {
    const db = api.database.store.db;
    const staffId = s.instructor.id as number;
    await sql`insert into sessions (staff_id, session_hash, expires_at) values
      (${staffId}, 'expired-session', now() - interval '1 minute'), (${staffId}, 'live-session', now() + interval '1 hour')`.execute(db);
    await sql`insert into idempotency_keys (staff_id, key, request_hash, status_code, body, created_at) values
      (${staffId}, 'old-key', 'h', 201, '{}', now() - make_interval(days => ${IDEMPOTENCY_DAYS}) - interval '1 minute'),
      (${staffId}, 'recent-key', 'h', 201, '{}', now() - make_interval(days => ${IDEMPOTENCY_DAYS}) + interval '1 hour')`.execute(db);
    // What the schedule adds every quarter of an hour, added now.
    await db.transaction().execute((trx) => api.app.jobs.send(trx, CLEANUP.name, [{}]));
    await vi.waitFor(
      async () => {
        const sessions = await sql<{ session_hash: string }>`select session_hash from sessions where session_hash like '%-session' order by 1`.execute(db);
        expect(sessions.rows.map((r) => r.session_hash)).toEqual(['live-session']);
        // Sessions and keys are deleted one after the other: wait for both.
        const keys = await sql<{ key: string }>`select key from idempotency_keys where key like '%-key' order by 1`.execute(db);
        expect(keys.rows.map((r) => r.key)).toEqual(['recent-key']);
      },
      { timeout: 30_000, interval: 200 },
    );
  });
});
