import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { chown, mkdtemp, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';

/**
 * A PostgreSQL instance of a test's own, to stop and restart at will without touching a shared server:
 * initdb and pg_ctl from Debian's PostgreSQL 15, run as the `postgres` user, in a temporary folder,
 * on a free port. Absent where those programs or that user are not there (then the test says so).
 */
const BIN = '/usr/lib/postgresql/15/bin';
const run = promisify(execFile);

export const ownPostgresMissing: string | undefined = !existsSync(join(BIN, 'pg_ctl'))
  ? `PostgreSQL 15's programs are not in ${BIN} (Debian's postgresql-15)`
  : process.getuid?.() !== 0
    ? 'starting an own PostgreSQL instance needs root, to run it as the postgres user'
    : undefined;

export interface OwnPostgres {
  url: string;
  port: number;
  stop(): Promise<void>;
  start(): Promise<void>;
  destroy(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

const asPostgres = (program: string, args: string[]) => run('runuser', ['-u', 'postgres', '--', join(BIN, program), ...args], { timeout: 60_000 });

export async function startOwnPostgres(): Promise<OwnPostgres> {
  const dir = await mkdtemp(join(tmpdir(), 'rateproof-pg-'));
  const { uid, gid } = await run('id', ['-u', 'postgres']).then(async ({ stdout }) => ({ uid: Number(stdout), gid: Number((await run('id', ['-g', 'postgres'])).stdout) }));
  await chown(dir, uid, gid);
  const data = join(dir, 'data');
  await asPostgres('initdb', ['-D', data, '-U', 'postgres', '--auth=trust', '--no-sync', '-E', 'UTF8']);
  const port = await freePort();
  const options = `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off`;
  const start = async () => {
    await asPostgres('pg_ctl', ['-D', data, '-o', options, '-l', join(dir, 'log'), '-w', 'start']);
  };
  await start();
  return {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    port,
    start,
    async stop() {
      await asPostgres('pg_ctl', ['-D', data, '-m', 'fast', '-w', 'stop']);
    },
    async destroy() {
      await asPostgres('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']).catch(() => {});
      await rm(dir, { recursive: true, force: true });
    },
  };
}
