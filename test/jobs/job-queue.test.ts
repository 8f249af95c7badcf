import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { JobQueue } from '../../server/jobs/job-queue.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/**
 * The job queue on both engines, held to the same tests: the embedded database runs the same library
 * in the one process, through the store's connection.
 */
describe.each(['pglite', 'postgres'] as const)('the job queue on %s', (engine) => {
  let database: TestDatabase;
  let queue: JobQueue;

  beforeAll(async () => {
    database = await openTestDatabase(engine);
    queue = await JobQueue.open(database.store, { upkeep: true });
  }, 120_000);
  afterAll(async () => {
    await queue?.stop(5);
    await database?.close();
  });

  it('adds a job with the transaction it is sent in: rolled back, none; committed, one, worked', async () => {
    await queue.define({ name: 'echo', retryLimit: 0, retryDelaySeconds: 1, expireInSeconds: 30 });
    const seen: number[] = [];
    await expect(
      database.store.db.transaction().execute(async (trx) => {
        await queue.send(trx, 'echo', [{ n: 1 }]);
        throw new Error('the request failed');
      }),
    ).rejects.toThrow('the request failed');
    await database.store.db.transaction().execute((trx) => queue.send(trx, 'echo', [{ n: 2 }]));
    await queue.work<{ n: number }>('echo', 1, async ({ n }) => void seen.push(n));
    await vi.waitFor(async () => expect((await queue.counts()).echo.completed).toBe(1), { timeout: 30_000, interval: 200 });
    expect(seen).toEqual([2]);
    const counts = (await queue.counts()).echo;
    expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBe(1);
  }, 60_000);

  it('tries a failing job again with growing waits, then succeeds', async () => {
    await queue.define({ name: 'flaky', retryLimit: 3, retryDelaySeconds: 1, expireInSeconds: 30 });
    const tries: Array<{ retryCount: number; at: number }> = [];
    await queue.work('flaky', 1, async (_data, attempt) => {
      tries.push({ retryCount: attempt.retryCount, at: performance.now() });
      if (tries.length < 3) throw new Error('not yet');
    });
    await database.store.db.transaction().execute((trx) => queue.send(trx, 'flaky', [{}]));
    await vi.waitFor(async () => expect((await queue.counts()).flaky.completed).toBe(1), { timeout: 30_000, interval: 200 });
    expect(tries.map((t) => t.retryCount)).toEqual([0, 1, 2]);
    // pg-boss 10.4.2 (src/plans.js, failJobs) waits delay * 2^(n+1)/2 * (1 + random()) seconds after
    // the n-th retry count's failure: at least 1 s after the first, at least 2 s after the second.
    expect(tries[1].at - tries[0].at).toBeGreaterThanOrEqual(1000);
    expect(tries[2].at - tries[1].at).toBeGreaterThanOrEqual(2000);
  }, 60_000);

  it('keeps a schedule in the database, one for every process', async () => {
    await queue.define({ name: 'nightly', retryLimit: 0, retryDelaySeconds: 1, expireInSeconds: 30 });
    await queue.schedule('nightly', '0 3 * * *');
    await queue.schedule('nightly', '0 3 * * *');
    const { rows } = await sql<{ name: string; cron: string }>`select name, cron from pgboss.schedule where name = 'nightly'`.execute(database.store.db);
    expect(rows).toEqual([{ name: 'nightly', cron: '0 3 * * *' }]);
  });
});
