/**
 * Where the database tests run, chosen by the setting TEST_DATABASE (docs/testing.md), never by looking
 * at the machine: `url` the PostgreSQL server in DATABASE_URL (CI sets one), `container` a
 * testcontainers PostgreSQL, `embedded` PostgreSQL in memory (PGlite). Unset: `url` when DATABASE_URL
 * is set, else `embedded`, so that `npm test` passes on a machine with nothing but Node.
 */
export type DatabaseTarget = { kind: 'url'; url: string } | { kind: 'container' } | { kind: 'embedded' };

const KINDS = ['embedded', 'url', 'container'] as const;

export function databaseTarget(env: NodeJS.ProcessEnv = process.env): DatabaseTarget {
  const chosen = env.TEST_DATABASE || (env.DATABASE_URL ? 'url' : 'embedded');
  if (!(KINDS as readonly string[]).includes(chosen)) {
    throw new Error(`TEST_DATABASE: one of ${KINDS.join(', ')} (got ${JSON.stringify(chosen)})`);
  }
  if (chosen === 'url') {
    if (!env.DATABASE_URL) throw new Error('TEST_DATABASE=url needs DATABASE_URL, the PostgreSQL server to test on');
    return { kind: 'url', url: env.DATABASE_URL };
  }
  return { kind: chosen as 'container' | 'embedded' };
}

/** The one line the test run prints about it; no password is shown. */
export function describeTarget(target: DatabaseTarget): string {
  switch (target.kind) {
    case 'url': {
      const url = new URL(target.url);
      return `database tests: PostgreSQL server at ${url.hostname}:${url.port || 5432} (TEST_DATABASE=url, DATABASE_URL)`;
    }
    case 'container':
      return 'database tests: PostgreSQL 15 in a testcontainers container (TEST_DATABASE=container)';
    case 'embedded':
      return 'database tests: embedded PostgreSQL (PGlite, in memory) (TEST_DATABASE=embedded)';
  }
}
