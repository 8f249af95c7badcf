import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { migrations } from '../../migrations/index.ts';
import { buildApp } from '../../server/app.ts';
import { openStore, type Store } from '../../server/store/connection.ts';
import { migrateToLatest } from '../../server/store/migrate.ts';
import { testConfig } from '../support/api-fixture.ts';
import { ownPostgresMissing, startOwnPostgres, type OwnPostgres } from '../support/own-postgres.ts';
import { parsePrometheusText, samplesOf } from '../support/prometheus-text.ts';

if (ownPostgresMissing) console.warn(`readiness test on a PostgreSQL server skipped: ${ownPostgresMissing}`);

const get = (app: FastifyInstance, url: string) => app.inject({ method: 'GET', url });

describe('/health and /ready on the embedded database', () => {
  it('is alive at once, and ready only once every migration of this version is applied', async () => {
    const store = openStore({ dataDir: 'memory://' });
    const app = await buildApp({ config: { ...testConfig, workers: 0 }, store });
    try {
      expect((await get(app, '/health')).statusCode).toBe(200);
      const before = await get(app, '/ready');
      expect(before.statusCode).toBe(503);
      // Every migration named in the list is said to be missing (the list itself, not a copy of it).
      for (const name of Object.keys(migrations)) expect(before.json().reason).toContain(name);
      expect(before.headers['retry-after']).toBe('5');

      await migrateToLatest(store.db);
      const after = await get(app, '/ready');
      expect([after.statusCode, after.json()]).toEqual([200, { ready: true, database: 'pglite' }]);
    } finally {
      await app.close();
      await store.close();
    }
  });
});

describe.skipIf(ownPostgresMissing)('/health and /ready on a PostgreSQL server that stops and starts', () => {
  let postgres: OwnPostgres;
  let store: Store;
  let app: FastifyInstance;

  beforeAll(async () => {
    postgres = await startOwnPostgres();
    store = openStore({ databaseUrl: postgres.url });
    // Working no jobs (--no-jobs): no poller takes a connection while the pool's gauges are read.
    app = await buildApp({ config: { ...testConfig, workers: 0, role: 'requests' }, store });
  }, 60_000);
  afterAll(async () => {
    await app?.close();
    await store?.close();
    await postgres?.destroy();
  });

  it('is alive throughout; ready with its schema current and the server up, 503 while it is away, ready again after', async () => {
    expect((await get(app, '/ready')).json().reason).toMatch(/^migrations not applied: /);
    await migrateToLatest(store.db);
    expect((await get(app, '/ready')).statusCode).toBe(200);

    await postgres.stop();
    const away = await get(app, '/ready');
    expect([away.statusCode, away.json()]).toEqual([503, { ready: false, database: 'postgres', reason: 'the database cannot be reached' }]);
    expect((await get(app, '/health')).statusCode).toBe(200);

    await postgres.start();
    await vi.waitFor(async () => expect((await get(app, '/ready')).statusCode).toBe(200), { timeout: 30_000, interval: 200 });
    expect((await get(app, '/health')).statusCode).toBe(200);

    // The connection pool's gauges, on a server: the probes' connections are back in the pool, none waiting.
    const families = parsePrometheusText((await get(app, '/metrics')).body);
    const gauge = (name: string) => samplesOf(families, name)[0]?.value;
    expect(gauge('rateproof_db_pool_max_connections')).toBe(10);
    expect(gauge('rateproof_db_pool_connections')).toBeGreaterThanOrEqual(1);
    expect(gauge('rateproof_db_pool_idle_connections')).toBe(gauge('rateproof_db_pool_connections'));
    expect(gauge('rateproof_db_pool_waiting_queries')).toBe(0);
  }, 120_000);
});
