import { CompiledQuery, type Kysely } from 'kysely';
import type { Store } from './connection.ts';
import type { Database } from './database.ts';

/** How the job library reaches the database: one statement with parameters, or a script without. */
export interface JobSql {
  executeSql(text: string, values?: unknown[]): Promise<{ rows: unknown[] }>;
}

const severalStatements = (text: string) => text.split(';').filter((s) => s.trim() !== '').length > 1;

/**
 * The job library's statements on the service's own connections: on `db`, a request's transaction,
 * a job is added with what the request stores or not at all. The library's scripts (its schema, its
 * upkeep) carry no parameters and their rows are not read.
 */
export function jobSql(store: Store, db: Kysely<Database> = store.db): JobSql {
  return {
    async executeSql(text, values = []) {
      if (values.length === 0 && severalStatements(text)) {
        await store.script(text);
        return { rows: [] };
      }
      const result = await db.executeQuery(CompiledQuery.raw(text, values));
      return { rows: [...result.rows] };
    },
  };
}
