import { readdir } from 'node:fs/promises';
import { Migrator, type Kysely, type Migration, type MigrationProvider } from 'kysely';
import type { Database } from './database.ts';

const folder = new URL('../../migrations/', import.meta.url);

/** Migrations are the files in migrations/, applied in name order (names start with a timestamp). */
const provider: MigrationProvider = {
  async getMigrations() {
    const files = (await readdir(folder)).filter((f) => /\.ts$/.test(f)).sort();
    const entries = await Promise.all(files.map(async (f) => [f.replace(/\.ts$/, ''), (await import(new URL(f, folder).href)) as Migration] as const));
    return Object.fromEntries(entries);
  },
};

export async function migrateToLatest(db: Kysely<Database>): Promise<string[]> {
  const { error, results } = await new Migrator({ db, provider }).migrateToLatest();
  if (error) throw error instanceof Error ? error : new Error(String(error));
  return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}
