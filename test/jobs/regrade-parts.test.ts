import type { FastifyInstance } from 'fastify';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/**
 * A regrade's parts done by hand, on a service that works no jobs itself (--no-jobs): a part done
 * twice, one after the other or both at once (a job taken up again while its first process still
 * works it), stores its results once.
 */
describe.each(['pglite', 'postgres'] as const)('regrade parts on %s', (engine) => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let s: Seed;
  const students = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'];

  beforeAll(async () => {
    database = await openTestDatabase(engine);
    app = await buildApp({ config: { ...testConfig, role: 'requests' }, store: database.store });
    s = await seedCourse(app);
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(students, 3), 201);
    await call(app, 'PATCH', `/v1/assignments/${s.assignment.id}/settings`, s.instructorToken, { settings: { fitModel: 'intercept' } }, 200);
  }, 120_000);
  afterAll(async () => {
    await app?.close();
    await database?.close();
  });

  const resultsPerSubmission = async (settingsVersion: number) =>
    (
      await sql<{ n: number }>`select (select count(*)::int from results r where r.submission_id = su.id and r.settings_version = ${settingsVersion}) as n
        from submissions su where su.assignment_id = ${s.assignment.id} order by su.id`.execute(database.store.db)
    ).rows.map((r) => r.n);

  it('stores a part once however often it is done, and counts it once', async () => {
    const started = await call(app, 'POST', `/v1/assignments/${s.assignment.id}/regrade`, s.instructorToken, {}, 202);
    expect(started.body).toMatchObject({ total: students.length, done: 0, status: 'running' });
    const part = { regradeId: started.body.regradeId as string, part: 0 };
    // Nobody works jobs here: the part waits until it is done by hand.
    expect((await call(app, 'GET', started.headers.location as string, s.instructorToken, undefined, 200)).body.done).toBe(0);
    await Promise.all([app.regrades.runPart(database.store.db, part), app.regrades.runPart(database.store.db, part)]);
    await app.regrades.runPart(database.store.db, part);
    expect(await resultsPerSubmission(2)).toEqual(students.map(() => 1));
    expect((await call(app, 'GET', started.headers.location as string, s.instructorToken, undefined, 200)).body).toMatchObject({ total: students.length, done: students.length, status: 'finished' });
  });

  it('a part given up on stops its regrade with a reason; the parts done stay', async () => {
    const started = await call(app, 'POST', `/v1/assignments/${s.assignment.id}/regrade`, s.instructorToken, {}, 202);
    await app.regrades.giveUp(database.store.db, { regradeId: started.body.regradeId, part: 0 });
    const progress = (await call(app, 'GET', started.headers.location as string, s.instructorToken, undefined, 200)).body;
    expect(progress).toMatchObject({ status: 'failed', done: 0 });
    expect(progress.error).toMatch(/starting the regrade again is safe/);
    // A part of a stopped regrade is not done any more.
    await app.regrades.runPart(database.store.db, { regradeId: started.body.regradeId, part: 0 });
    expect(await resultsPerSubmission(2)).toEqual(students.map(() => 1));
  });

  it('answers 404 for a regrade of another assignment or none, and 400 naming a section of another course', async () => {
    const missing = await call(app, 'GET', `/v1/assignments/${s.assignment.id}/regrades/00000000-0000-4000-8000-000000000000`, s.instructorToken, undefined, 404);
    expect(missing.body.error.code).toBe('not-found');
    const bad = await call(app, 'POST', `/v1/assignments/${s.assignment.id}/regrade`, s.instructorToken, { sectionId: 999_999 }, 400);
    expect(bad.body.error.details).toEqual([{ path: 'body.sectionId', message: 'no such section in this course' }]);
    // Nothing of the refused request stored.
    const { rows } = await sql<{ n: number }>`select count(*)::int as n from regrades where assignment_id = ${s.assignment.id}`.execute(database.store.db);
    expect(rows[0].n).toBe(2);
  });
});
