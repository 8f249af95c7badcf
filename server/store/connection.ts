import { mkdirSync } from 'node:fs';
import { PGlite } from '@electric-sql/pglite';
import { Kysely, PostgresDialect, sql } from 'kysely';
import { PGliteDialect } from 'kysely-pglite-dialect';
import pg from 'pg';
import { lockDataFolder } from './data-folder-lock.ts';
import type { Database } from './database.ts';

export interface Store {
  db: Kysely<Database>;
  /** Which server holds the data: a PostgreSQL server, or the embedded one in a data folder. */
  engine: 'postgres' | 'pglite';
  /** The connection pool's state (a PostgreSQL server only: the embedded database is one connection in the process). */
  connections?(): PoolConnections;
  /**
   * Runs statements given as one text without parameters (a library's schema scripts), each in turn,
   * on a connection of its own: the embedded engine's query protocol takes one statement at a time.
   */
  script(text: string): Promise<void>;
  /** Closes the connections and gives back the data folder's lock. */
  close(): Promise<void>;
}

export interface PoolConnections {
  /** Open connections, in use or idle. */
  total: number;
  idle: number;
  /** Queries waiting for a connection: every one is in use and the pool is at its maximum. */
  waiting: number;
  max: number;
}

const MAX_CONNECTIONS = 10;

/** A PostgreSQL server when a URL is given; else embedded PostgreSQL (PGlite) in `dataDir`. */
export function openStore(options: { databaseUrl?: string; dataDir?: string }): Store {
  if (options.databaseUrl) {
    // A request waits at most 5 s for a connection, so that one made while the database is away is
    // answered (503) rather than left hanging.
    const pool = new pg.Pool({ connectionString: options.databaseUrl, max: MAX_CONNECTIONS, connectionTimeoutMillis: 5000 });
    // A connection lost to a database restart: the pool drops an idle one, and a query on one in use
    // fails (answered 503). Without these listeners the lost connection's event would end the process.
    pool.on('error', () => {});
    pool.on('connect', (client) => client.on('error', () => {}));
    const db = new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
    const connections = () => ({ total: pool.totalCount, idle: pool.idleCount, waiting: pool.waitingCount, max: MAX_CONNECTIONS });
    // Without parameters pg sends the simple query protocol, which takes several statements.
    const script = async (text: string) => void (await sql.raw(text).execute(db));
    return { db, engine: 'postgres', connections, script, close: () => db.destroy() };
  }
  const dir = options.dataDir ?? './data';
  // memory:// keeps the embedded database in memory (tests); anything else is a folder, one process at a time.
  let release = () => {};
  if (!dir.startsWith('memory://')) {
    mkdirSync(dir, { recursive: true });
    release = lockDataFolder(dir);
  }
  const pglite = new PGlite(dir);
  const db = new Kysely<Database>({ dialect: new PGliteDialect(pglite) });
  return {
    db,
    engine: 'pglite',
    // Holding kysely's one connection keeps every other query (and any open transaction) out meanwhile.
    script: (text) => db.connection().execute(async () => void (await pglite.exec(text))),
    async close() {
      try {
        await db.destroy();
      } finally {
        release();
      }
    },
  };
}
