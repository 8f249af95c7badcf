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

/** A new, empty database on the PostgreSQL server at `serverUrl`, with its URL; `drop` removes it. */
export async function scratchDatabase(serverUrl: string, prefix = 'rateproof_test'): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `${prefix}_${randomBytes(6).toString('hex')}`;
  const onServer = async (statement: string) => {
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    try {
      await admin.query(statement);
    } finally {
      await admin.end();
    }
  };
  await onServer(`CREATE DATABASE ${name}`);
  const target = new URL(serverUrl);
  target.pathname = `/${name}`;
  return { url: target.toString(), drop: () => onServer(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`) };
}

async function onServer(url: string): Promise<TestDatabase> {
  const scratch = await scratchDatabase(url);
  const store = openStore({ databaseUrl: scratch.url });
  await migrateToLatest(store.db);
  return {
    store,
    async close() {
      await store.close();
      await scratch.drop();
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
