import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { openStore, type Store } from '../../server/store/connection.ts';
import { migrateToLatest } from '../../server/store/migrate.ts';

/**
 * A fresh, migrated database for one test file, on a real PostgreSQL server: DATABASE_URL where it is
 * set (a new database is created on that server and dropped afterwards), else a testcontainers
 * PostgreSQL where a Docker engine answers; otherwise the tests fail saying no server was found.
 * `pglite` gives the embedded engine instead, in memory.
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
      await store.db.destroy();
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
      `no PostgreSQL server found: set DATABASE_URL to a server the tests may create databases on, or start a Docker engine for testcontainers (${(error as Error).message})`,
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

export async function openTestDatabase(engine: 'postgres' | 'pglite' = 'postgres'): Promise<TestDatabase> {
  if (engine === 'pglite') {
    const store = openStore({ dataDir: 'memory://' });
    await migrateToLatest(store.db);
    return { store, close: () => store.db.destroy() };
  }
  const url = process.env.DATABASE_URL;
  return url ? onServer(url) : inContainer();
}
