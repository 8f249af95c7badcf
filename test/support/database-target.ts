import { existsSync } from 'node:fs';

/**
 * Where the database tests run: the PostgreSQL server in DATABASE_URL (CI sets one); else a
 * testcontainers PostgreSQL where a Docker engine is configured; else embedded PostgreSQL (PGlite) in
 * memory, so that `npm test` passes on a machine with nothing but Node.
 */
export type DatabaseTarget = { kind: 'server'; url: string } | { kind: 'container' } | { kind: 'embedded' };

export function databaseTarget(env: NodeJS.ProcessEnv = process.env): DatabaseTarget {
  if (env.DATABASE_URL) return { kind: 'server', url: env.DATABASE_URL };
  if (env.DOCKER_HOST || existsSync('/var/run/docker.sock')) return { kind: 'container' };
  return { kind: 'embedded' };
}

/** The one line the test run prints about it; no password is shown. */
export function describeTarget(target: DatabaseTarget): string {
  switch (target.kind) {
    case 'server': {
      const url = new URL(target.url);
      return `database tests: PostgreSQL server at ${url.hostname}:${url.port || 5432} (DATABASE_URL)`;
    }
    case 'container':
      return 'database tests: PostgreSQL 15 in a testcontainers container (a Docker engine is configured)';
    case 'embedded':
      return 'database tests: embedded PostgreSQL (PGlite, in memory), since neither DATABASE_URL nor a Docker engine is set';
  }
}
