import type { FastifyInstance } from 'fastify';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ADMIN_TOKEN, seedCourse, submissionsFor, type Seed } from '../support/api-fixture.ts';
import { ownPostgresMissing, startOwnPostgres, type OwnPostgres } from '../support/own-postgres.ts';
import { serve } from '../support/serve-process.ts';

if (ownPostgresMissing) console.warn(`kill test skipped: ${ownPostgresMissing}`);

/** Just enough of `app.inject` over real HTTP for the seeding helpers to talk to a service process. */
function overHttp(port: number) {
  return {
    async inject({ method, url, headers, payload }: { method: string; url: string; headers?: Record<string, string>; payload?: unknown }) {
      const res = await fetch(`http://127.0.0.1:${port}${url}`, {
        method,
        headers: { ...headers, ...(payload === undefined ? {} : { 'content-type': 'application/json' }) },
        body: payload === undefined ? undefined : JSON.stringify(payload),
      });
      const body = await res.text();
      return { statusCode: res.status, headers: Object.fromEntries(res.headers), body, json: () => JSON.parse(body) };
    },
  } as unknown as FastifyInstance;
}

describe.skipIf(ownPostgresMissing)('the service killed (SIGKILL) in the middle of a batch', () => {
  let postgres: OwnPostgres;
  let s: Seed;
  const env = () => ({ DATABASE_URL: postgres.url, RATEPROOF_ADMIN_TOKEN: ADMIN_TOKEN, RATEPROOF_BODY_LIMIT_MB: '20' });

  beforeAll(async () => {
    postgres = await startOwnPostgres();
  }, 60_000);
  afterAll(async () => postgres?.destroy());

  it('leaves each batch stored whole or not at all, every submission with its result, and starts again', async () => {
    const ids = Array.from({ length: 1500 }, (_, i) => `K-${String(i + 1).padStart(4, '0')}`);
    const batch = submissionsFor(ids, 11);
    for (const delay of [150, 400, 700]) {
      const service = serve(env());
      const port = await service.listening;
      const app = overHttp(port);
      if (!s) {
        s = await seedCourse(app);
        await app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/roster`, headers: { authorization: `Bearer ${s.instructorToken}` }, payload: { students: ids.map((studentId) => ({ studentId })) } });
      }
      const sent = app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: { authorization: `Bearer ${s.taAToken}` }, payload: batch });
      await new Promise((resolve) => setTimeout(resolve, delay));
      service.child.kill('SIGKILL');
      await sent.catch(() => undefined);
      await service.exited;

      const client = new pg.Client({ connectionString: postgres.url });
      await client.connect();
      const { rows } = await client.query<{ submissions: number; unresulted: number }>(
        `select count(*)::int as submissions,
                count(*) filter (where not exists (select 1 from results r where r.submission_id = su.id))::int as unresulted
         from submissions su where su.assignment_id = $1`,
        [s.assignment.id],
      );
      await client.end();
      expect(rows[0].unresulted).toBe(0);
      // Whole batches only: a multiple of the batch's size.
      expect(rows[0].submissions % ids.length).toBe(0);
    }
    const again = serve(env());
    const port = await again.listening;
    const health = await fetch(`http://127.0.0.1:${port}/health`);
    expect(health.status).toBe(200);
    again.child.kill('SIGTERM');
    await again.exited;
  }, 120_000);
});
