import { Migrator, type Kysely, type MigrationProvider } from 'kysely';
import { migrations } from '../../migrations/index.ts';
import type { Database } from './database.ts';

const provider: MigrationProvider = { getMigrations: async () => migrations };

export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const { error, results } = await new Migrator({ db, provider }).migrateToLatest();
  if (error) throw error instanceof Error ? error : new Error(String(error));
  return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}

/** The migrations of this version not applied to the database (none: its schema is current). */
export async function pendingMigrations(db: Kysely<Database>): Promise<string[]> {
  const known = await new Migrator({ db, provider }).getMigrations();
  return known.filter((m) => m.executedAt === undefined).map((m) => m.name);
}
