import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { CLEANUP, IDEMPOTENCY_DAYS } from '../../server/grading/service-jobs.ts';
import { call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/** Grade passback without a platform, and the scheduled cleanup, worked by the service's own queue. */
describe('passback and cleanup jobs', () => {
  let api: Api;
  let s: Seed;

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 120_000);
  afterAll(async () => api?.close());

  it('a release of students no learning platform knows sends no grade anywhere, and the results page says none was sent', async () => {
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001', 'S-002'], 4), 201);
    expect((await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, s.taAToken, undefined, 200)).body).toEqual({ released: 2, held: 0 });
    const page = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, s.taAToken, undefined, 200)).body as Array<{ studentId: string; released: boolean; gradeSent: unknown }>;
    expect(page.filter((r) => r.released).map((r) => [r.studentId, r.gradeSent])).toEqual([['S-001', null], ['S-002', null]]);
    const { rows } = await sql<{ n: number }>`select count(*)::int as n from grade_sends`.execute(api.database.store.db);
    expect(rows[0].n).toBe(0);
    // Nothing failed, so there is nothing to send again.
    expect((await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/passback`, s.taAToken, undefined, 200)).body).toEqual({ waiting: 0 });
    // A release with nothing new releases nothing.
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
