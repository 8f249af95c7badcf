import { openStore, type Store } from './connection.ts';
import { migrateToLatest } from './migrate.ts';

/** The database could not be opened or migrated at start-up: one line says why. */
export class StartupError extends Error {}

/** Opens the configured database and applies pending migrations; returns the migrations applied. */
export async function openMigratedStore(options: { databaseUrl?: string; dataDir?: string }): Promise<{ store: Store; applied: string[] }> {
  let store: Store | undefined;
  try {
    store = openStore(options);
    return { store, applied: await migrateToLatest(store.db) };
  } catch (error) {
    await store?.close().catch(() => {});
    const where = options.databaseUrl ? 'the PostgreSQL server in DATABASE_URL' : `the embedded database in ${options.dataDir ?? './data'}`;
    const reason = (error as Error).message || String(error);
    throw new StartupError(error instanceof Error && error.name === 'DataFolderInUse' ? reason : `cannot open ${where}: ${reason}`);
  }
}
