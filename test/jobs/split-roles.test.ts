import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ADMIN_TOKEN, seedCourse, submissionsFor } from '../support/api-fixture.ts';
import { parsePrometheusText, samplesOf } from '../support/prometheus-text.ts';
import { overHttp, serve } from '../support/serve-process.ts';
import { scratchDatabase } from '../support/test-database.ts';

/**
 * `rateproof serve --no-jobs` adds jobs and works none; `rateproof serve --jobs-only` serves no HTTP
 * and works them. Needs a server (DATABASE_URL): the split needs one.
 */
const SERVER = process.env.DATABASE_URL;
if (!SERVER) console.warn('split-roles test skipped: it needs a PostgreSQL server in DATABASE_URL');

describe.skipIf(!SERVER)('serve --no-jobs and --jobs-only', () => {
  let url: string;
  let drop = async () => {};
  const services: Array<ReturnType<typeof serve>> = [];

  beforeAll(async () => {
    ({ url, drop } = await scratchDatabase(SERVER!, 'rateproof_roles'));
  });
  afterAll(async () => {
    for (const service of services) if (service.child.exitCode === null && service.child.signalCode === null) service.child.kill('SIGTERM');
    await Promise.all(services.map((service) => service.exited));
    await drop();
  });

  it('the first queues a regrade and works nothing of it; the second, serving nothing, works it', async () => {
    const env = { DATABASE_URL: url, RATEPROOF_ADMIN_TOKEN: ADMIN_TOKEN, RATEPROOF_WORKERS: '1' };
    const requests = serve(env, ['--no-jobs']);
    services.push(requests);
    const app = overHttp(await requests.listening);
    const s = await seedCourse(app);
    const auth = { authorization: `Bearer ${s.instructorToken}` };
    const submitted = await app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: auth, payload: submissionsFor(['S-001', 'S-002', 'S-003'], 6) });
    expect(submitted.statusCode).toBe(201);
    const started = await app.inject({ method: 'POST', url: `/v1/assignments/${s.assignment.id}/regrade`, headers: auth, payload: {} });
    expect(started.statusCode).toBe(202);
    const progress = async () => (await app.inject({ method: 'GET', url: started.headers.location as string, headers: auth })).json() as { done: number; total: number; status: string };

    expect(await progress()).toMatchObject({ done: 0, total: 3, status: 'running' });

    const jobs = serve(env, ['--jobs-only']);
    services.push(jobs);
    await vi.waitFor(async () => expect(await progress()).toMatchObject({ done: 3, total: 3, status: 'finished' }), { timeout: 90_000, interval: 500 });
    // The first worked none of it: it timed no job's try.
    const metrics = parsePrometheusText((await app.inject({ method: 'GET', url: '/metrics' })).body);
    expect(samplesOf(metrics, 'rateproof_job_duration_seconds_count', { queue: 'regrade-part' })).toEqual([]);
    // The second never listened.
    expect(jobs.child.exitCode).toBeNull();
    await expect(Promise.race([jobs.listening.then(() => 'listening'), new Promise((resolve) => setTimeout(() => resolve('not listening'), 100))])).resolves.toBe('not listening');
  }, 180_000);
});
