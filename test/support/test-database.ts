import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { openStore, type Store } from '../../server/store/connection.ts';
import { migrateToLatest } from '../../server/store/migrate.ts';
import { databaseTarget } from './database-target.ts';

/**
 * A fresh, migrated database for one test file. `postgres` gives the one TEST_DATABASE chooses
 * (database-target.ts): the server in DATABASE_URL (a new database is created on it and dropped
 * afterwards), a testcontainers PostgreSQL, or the embedded engine. `pglite` always gives the embedded
 * engine, in memory.
 */
export interface TestDatabase {
  store: Store;
  close(): Promise<void>;
}

async function onServer(url: string): Promise<TestDatabase> {
  const name = `rateproof_test_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: url });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.end();
  const target = new URL(url);
  target.pathname = `/${name}`;
  const store = openStore({ databaseUrl: target.toString() });
  await migrateToLatest(store.db);
  return {
    store,
    async close() {
      await store.close();
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await c.end();
    },
  };
}

async function inContainer(): Promise<TestDatabase> {
  const { PostgreSqlContainer } = await import('@testcontainers/postgresql');
  let container;
  try {
    container = await new PostgreSqlContainer('postgres:15').start();
  } catch (error) {
    throw new Error(
      `TEST_DATABASE=container, but no PostgreSQL container started: is a Docker engine running? TEST_DATABASE=embedded tests without one (${(error as Error).message})`,
    );
  }
  const db = await onServer(container.getConnectionUri());
  return {
    store: db.store,
    async close() {
      await db.close();
      await container.stop();
    },
  };
}

async function embedded(): Promise<TestDatabase> {
  const store = openStore({ dataDir: 'memory://' });
  await migrateToLatest(store.db);
  return { store, close: () => store.close() };
}

export async function openTestDatabase(engine: 'postgres' | 'pglite' = 'postgres'): Promise<TestDatabase> {
  const target = engine === 'pglite' ? ({ kind: 'embedded' } as const) : databaseTarget();
  if (target.kind === 'url') return onServer(target.url);
  return target.kind === 'container' ? inContainer() : embedded();
}
