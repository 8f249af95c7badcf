import type { FastifyInstance } from 'fastify';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ADMIN_TOKEN, seedCourse, submissionsFor, type Seed } from '../support/api-fixture.ts';
import { overHttp, serve } from '../support/serve-process.ts';
import { scratchDatabase } from '../support/test-database.ts';

/**
 * The service process killed (SIGKILL) while a batch's transaction is open on a PostgreSQL server: the
 * server rolls the transaction back, so nothing of the batch is stored, and the next batch stores whole.
 * Needs a server (DATABASE_URL; CI has one): the embedded engine dies with the process it runs in.
 */
const SERVER = process.env.DATABASE_URL;
const NO_SERVER = !SERVER;
if (NO_SERVER) console.warn('kill test skipped: it needs a PostgreSQL server in DATABASE_URL (the embedded engine dies with the service)');

/** How the test finds the service's connections in pg_stat_activity. */
const APPLICATION_NAME = 'rateproof-killed-mid-batch';

interface Backend {
  pid: number;
  xid: string;
  query: string;
}

describe.skipIf(NO_SERVER)('the service killed (SIGKILL) while a batch’s transaction is open', () => {
  let url: string;
  let drop = async () => {};
  /** The test's own connections to the service's database: one reads pg_stat_activity (which a
   * transaction would see frozen at its first read) and the tables, one holds a lock. */
  let admin: pg.Client;
  let locker: pg.Client;
  const services: Array<ReturnType<typeof serve>> = [];
  const start = () => {
    const service = serve({ DATABASE_URL: url, PGAPPNAME: APPLICATION_NAME, RATEPROOF_ADMIN_TOKEN: ADMIN_TOKEN, RATEPROOF_BODY_LIMIT_MB: '20' });
    services.push(service);
    return service;
  };

  beforeAll(async () => {
    ({ url, drop } = await scratchDatabase(SERVER!, 'rateproof_kill'));
    admin = new pg.Client({ connectionString: url });
    await admin.connect();
    locker = new pg.Client({ connectionString: url });
    await locker.connect();
  });
  afterAll(async () => {
    // A service left running by a failed step.
    for (const service of services) if (service.child.exitCode === null && service.child.signalCode === null) service.child.kill('SIGKILL');
    await Promise.all(services.map((service) => service.exited));
    await locker?.end();
    await admin?.end();
    await drop();
  });

  /** The service's backend that is inside a transaction that has written, and waits for a lock. */
  async function backendInOpenTransaction(): Promise<Backend> {
    const { rows } = await admin.query<Backend>(
      `select pid, backend_xid::text as xid, query from pg_stat_activity
       where datname = current_database() and application_name = $1
         and xact_start is not null and backend_xid is not null and wait_event_type = 'Lock'`,
      [APPLICATION_NAME],
    );
    if (rows.length !== 1) {
      const seen = await admin.query(`select application_name, state, wait_event_type, backend_xid::text as xid, left(query, 40) as query
        from pg_stat_activity where datname = current_database() and pid <> pg_backend_pid()`);
      throw new Error(`no service backend waits inside an open transaction yet; the database's other backends: ${JSON.stringify(seen.rows)}`);
    }
    return rows[0];
  }

  /** pg_xact_status takes a full (epoch-qualified) transaction id; pg_stat_activity gives its low 32 bits. */
  async function transactionStatus(xid: string): Promise<string> {
    const { rows } = await admin.query<{ xmax: string }>('select pg_snapshot_xmax(pg_current_snapshot())::text as xmax');
    const xmax = BigInt(rows[0].xmax);
    let full = ((xmax >> 32n) << 32n) | BigInt(xid);
    if (full >= xmax) full -= 1n << 32n;
    const status = await admin.query<{ status: string }>('select pg_xact_status($1::text::xid8) as status', [full.toString()]);
    return status.rows[0].status;
  }

  async function stored(assignmentId: number) {
    const { rows } = await admin.query<{ submissions: number; unresulted: number; versions: number[] }>(
      `select count(*)::int as submissions,
              count(*) filter (where not exists (select 1 from results r where r.submission_id = su.id))::int as unresulted,
              coalesce(array_agg(distinct su.version order by su.version), '{}') as versions
       from submissions su where su.assignment_id = $1`,
      [assignmentId],
    );
    return rows[0];
  }

  it('stores nothing of the batch (its transaction is rolled back), and the next batch stores whole', async () => {
    const ids = Array.from({ length: 1500 }, (_, i) => `K-${String(i + 1).padStart(4, '0')}`);
    const batch = submissionsFor(ids, 11);

    const first = start();
    const app = overHttp(await first.listening);
    const s: Seed = await seedCourse(app);
    const roster = await app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/roster`, headers: { authorization: `Bearer ${s.instructorToken}` }, payload: { students: ids.map((studentId) => ({ studentId })) } });
    expect(roster.statusCode).toBe(200);
    const submit = (to: FastifyInstance) =>
      to.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: { authorization: `Bearer ${s.taAToken}` }, payload: batch });

    // Writes to `results` wait while this lock is held (SHARE conflicts with an INSERT's ROW EXCLUSIVE;
    // reads go on): the batch's transaction stops open, after its first writes, for as long as the test
    // likes, instead of the kill having to land in a window of some milliseconds.
    await locker.query('begin');
    await locker.query('lock table results in share mode');
    const sent = submit(app);
    const answered = sent.then(
      () => 'answered',
      () => 'no answer',
    );
    const backend = await vi.waitFor(backendInOpenTransaction, { timeout: 60_000, interval: 20 });
    expect(backend.query).toMatch(/^insert into "results"/i);
    first.child.kill('SIGKILL');
    await first.exited;
    expect(await answered).toBe('no answer');
    await locker.query('rollback');

    // The server ends the dead client's backend and rolls its transaction back.
    await vi.waitFor(
      async () => {
        const { rowCount } = await admin.query('select 1 from pg_stat_activity where pid = $1', [backend.pid]);
        if (rowCount !== 0) throw new Error(`backend ${backend.pid} still there`);
      },
      { timeout: 30_000, interval: 20 },
    );
    expect(await transactionStatus(backend.xid)).toBe('aborted');
    expect(await stored(s.assignment.id)).toEqual({ submissions: 0, unresulted: 0, versions: [] });

    // Started again, the service takes the same batch whole: version 1 for every student, since the
    // killed batch left none behind.
    const second = start();
    const again = overHttp(await second.listening);
    const ready = await again.inject({ method: 'GET', url: '/ready' });
    expect(ready.statusCode).toBe(200);
    const res = await submit(again);
    expect(res.statusCode).toBe(201);
    expect(res.json().stored).toHaveLength(1500);
    expect(await stored(s.assignment.id)).toEqual({ submissions: 1500, unresulted: 0, versions: [1] });
    second.child.kill('SIGTERM');
    expect((await second.exited).code).toBe(0);
  }, 120_000);
});
