import type { FastifyInstance } from 'fastify';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { openStore, type Store } from '../../server/store/connection.ts';
import { migrateToLatest } from '../../server/store/migrate.ts';
import { bearer, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { ownPostgresMissing, startOwnPostgres, type OwnPostgres } from '../support/own-postgres.ts';

if (ownPostgresMissing) console.warn(`database restart test skipped: ${ownPostgresMissing}`);

/** A client's pause before it retries after a 503 (a TA's tool would honour Retry-After; the test is in a hurry). */
const backOff = () => new Promise((resolve) => setTimeout(resolve, 100));

describe.skipIf(ownPostgresMissing)('the service through a restart of its PostgreSQL server', () => {
  let postgres: OwnPostgres;
  let store: Store;
  let app: FastifyInstance;
  let s: Seed;

  beforeAll(async () => {
    postgres = await startOwnPostgres();
    store = openStore({ databaseUrl: postgres.url });
    await migrateToLatest(store.db);
    app = await buildApp({ config: testConfig, store });
    s = await seedCourse(app);
  }, 60_000);
  // Stopping a PostgreSQL server of its own takes a while on a busy machine.
  afterAll(async () => {
    await app?.close();
    await store?.close();
    await postgres?.destroy();
  }, 120_000);

  it('answers 503 with Retry-After while it is away (never 500), says so at /ready (alive at /health throughout), recovers by itself, and loses no confirmed grade', async () => {
    const url = `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`;
    const statuses: number[] = [];
    const confirmed: number[] = [];
    let loading = true;
    // Three TAs' tools submitting in a loop, each for students of its own.
    const loaders = [['S-001', 'S-002'], ['S-003', 'S-004'], ['S-005', 'S-006']].map(async (ids, n) => {
      for (let round = 0; loading; round++) {
        const res = await app.inject({ method: 'POST', url, headers: bearer(s.taAToken), payload: submissionsFor(ids, 100 * n + round) });
        statuses.push(res.statusCode);
        if (res.statusCode === 201) confirmed.push(...res.json().stored.map((x: { submissionId: number }) => x.submissionId));
        if (res.statusCode === 503) {
          expect(res.headers['retry-after']).toBe('5');
          expect(res.json().error.code).toBe('database-unavailable');
          await backOff();
        }
      }
    });

    // The loaders have stored something before the server goes away.
    await vi.waitFor(() => expect(confirmed.length).toBeGreaterThan(0), { timeout: 30_000 });
    await postgres.stop();
    // /ready notices it is away by itself (its answer is the condition waited on, then checked).
    const away = await vi.waitFor(
      async () => {
        const res = await app.inject({ method: 'GET', url: '/ready' });
        expect(res.statusCode).toBe(503);
        return res;
      },
      { timeout: 30_000, interval: 100 },
    );
    expect(away.json()).toMatchObject({ ready: false, reason: 'the database cannot be reached' });
    // The process itself still answers: a supervisor has no reason to restart it.
    expect((await app.inject({ method: 'GET', url: '/health' })).statusCode).toBe(200);
    const during = await app.inject({ method: 'GET', url: `${url.replace('/submissions', '/results')}`, headers: bearer(s.taAToken) });
    expect(during.statusCode).toBe(503);
    // A batch sent while it is away: refused whole, with the code a client retries on. (The loaders
    // may or may not be caught mid-request, depending on the machine's load; this one always is.)
    const batch = await app.inject({ method: 'POST', url, headers: bearer(s.taAToken), payload: submissionsFor(['S-001'], 7) });
    expect([batch.statusCode, batch.headers['retry-after'], batch.json().error.code]).toEqual([503, '5', 'database-unavailable']);

    await postgres.start();
    await vi.waitFor(async () => expect((await app.inject({ method: 'GET', url: '/ready' })).statusCode).toBe(200), { timeout: 30_000, interval: 200 });
    // After it is back, a loader's batch is stored again.
    const after = statuses.length;
    await vi.waitFor(() => expect(statuses.slice(after)).toContain(201), { timeout: 30_000 });
    loading = false;
    await Promise.all(loaders);

    expect(statuses.filter((code) => code !== 201 && code !== 503)).toEqual([]);
    // Every submission the service confirmed is stored, with its result.
    const { rows } = await sql<{ n: number }>`select count(distinct s.id)::int as n from submissions s join results r on r.submission_id = s.id where s.id = any(${confirmed})`.execute(store.db);
    expect(rows[0].n).toBe(new Set(confirmed).size);
  }, 120_000);
});
