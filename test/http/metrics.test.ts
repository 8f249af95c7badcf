import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { bearer, call, openApi, regradeAndWait, seedCourse, submissionsFor, testConfig, type Api, type Seed } from '../support/api-fixture.ts';
import { parsePrometheusText, samplesOf } from '../support/prometheus-text.ts';

const METRICS_TOKEN = 'metrics-token-for-tests-only-0123456789';

describe('/metrics', () => {
  let api: Api;
  let s: Seed;

  beforeAll(async () => {
    api = await openApi('pglite');
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  const read = async () => {
    const res = await api.app.inject({ method: 'GET', url: '/metrics' });
    expect(res.statusCode).toBe(200);
    return res;
  };

  it('answers in the Prometheus text format, with a histogram per route pattern and no student id anywhere', async () => {
    await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001', 'S-002']), 201);
    const history = (studentId: string) => `/v1/sections/${s.sectionA.id}/students/${studentId}/history`;
    await call(api.app, 'GET', history('S-001'), s.taAToken, undefined, 200);
    await call(api.app, 'GET', history('ZZ-NOT-ENROLLED-9'), s.taAToken, undefined, 404);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-004`, s.instructorToken, { status: 'withdrawn' }, 200);
    // A URL that matches no route, a student id in it.
    await call(api.app, 'GET', `/v1/nowhere/S-005`, s.taAToken, undefined, 404);

    const res = await read();
    // The format's media type, version 0.0.4 (common practice, from memory).
    expect(res.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
    const families = parsePrometheusText(res.body);

    expect(families.get('rateproof_http_request_duration_seconds')?.type).toBe('histogram');
    const student = samplesOf(families, 'rateproof_http_request_duration_seconds_count', { method: 'GET', route: '/v1/sections/:sectionId/students/:studentId/history' });
    // One 200 and one 404 on the pattern, each its own status class.
    expect(student.map((x) => [x.labels.status_class, x.value]).sort()).toEqual([['2xx', 1], ['4xx', 1]]);
    expect(samplesOf(families, 'rateproof_http_request_duration_seconds_count', { method: 'PUT', route: '/v1/sections/:sectionId/roster/:studentId' })[0]?.value).toBe(1);
    expect(samplesOf(families, 'rateproof_http_request_duration_seconds_count', { route: 'unmatched', status_class: '4xx' })[0]?.value).toBe(1);
    const buckets = samplesOf(families, 'rateproof_http_request_duration_seconds_bucket', { route: '/v1/sections/:sectionId/assignments/:assignmentId/submissions', status_class: '2xx' });
    expect(buckets.at(-1)).toMatchObject({ labels: { le: '+Inf' }, value: 1 });

    for (const id of ['S-001', 'S-002', 'S-004', 'S-005', 'ZZ-NOT-ENROLLED-9', 'nowhere']) expect(res.body).not.toContain(id);
    // The process's own metrics are there too.
    expect(families.get('process_cpu_seconds_total')?.type).toBe('counter');
  });

  it('counts jobs by queue and state from the database, times each try, and shows the worker pool', async () => {
    const before = parsePrometheusText((await read()).body);
    const sample = (families: typeof before, name: string, labels: Record<string, string>) => samplesOf(families, name, labels)[0]?.value ?? 0;
    // Every queue's states are listed from the start, at 0 or more.
    for (const state of ['created', 'retry', 'active', 'completed', 'cancelled', 'failed']) expect(samplesOf(before, 'rateproof_jobs', { queue: 'regrade-part', state })).toHaveLength(1);
    const completedBefore = sample(before, 'rateproof_jobs', { queue: 'regrade-part', state: 'completed' });
    const timedBefore = sample(before, 'rateproof_job_duration_seconds_count', { queue: 'regrade-part', outcome: 'completed' });
    const { progress } = await regradeAndWait(api.app, s.instructorToken, s.assignment.id);
    expect(progress.status).toBe('finished');
    expect(progress.total).toBeGreaterThan(0);
    // The regrade's submissions are cut into parts of at most 250, one job each (the design in server/grading/regrade.ts).
    const parts = Math.ceil(progress.total / 250);

    // The job is marked completed just after its part's transaction: the counts catch up at once or shortly.
    const after = await vi.waitFor(async () => {
      const now = parsePrometheusText((await read()).body);
      expect(sample(now, 'rateproof_jobs', { queue: 'regrade-part', state: 'completed' })).toBe(completedBefore + parts);
      return now;
    }, { timeout: 10_000, interval: 100 });
    expect(sample(after, 'rateproof_jobs', { queue: 'regrade-part', state: 'failed' })).toBe(0);
    expect(sample(after, 'rateproof_jobs', { queue: 'regrade-part', state: 'active' })).toBe(0);
    expect(sample(after, 'rateproof_job_duration_seconds_count', { queue: 'regrade-part', outcome: 'completed' })).toBe(timedBefore + parts);
    expect(sample(after, 'rateproof_job_duration_seconds_count', { queue: 'regrade-part', outcome: 'failed' })).toBe(0);

    // The regrade checked in the pool: at least one thread started, none busy once it is done.
    const threads = samplesOf(after, 'rateproof_worker_pool_threads')[0].value;
    const max = samplesOf(after, 'rateproof_worker_pool_threads_max')[0].value;
    expect(threads).toBeGreaterThanOrEqual(1);
    expect(threads).toBeLessThanOrEqual(max);
    expect(samplesOf(after, 'rateproof_worker_pool_busy_tasks')[0].value).toBe(0);
    expect(samplesOf(after, 'rateproof_worker_pool_queued_tasks')[0].value).toBe(0);
    // The embedded database has no connection pool: no gauges that would say nothing.
    expect(after.has('rateproof_db_pool_connections')).toBe(false);
  }, 60_000);

  it('without a metrics token, answers this machine only (not another address, not what a proxy forwards)', async () => {
    expect((await api.app.inject({ method: 'GET', url: '/metrics', remoteAddress: '10.1.2.3' })).statusCode).toBe(404);
    expect((await api.app.inject({ method: 'GET', url: '/metrics', headers: { 'x-forwarded-for': '10.1.2.3' } })).statusCode).toBe(404);
    expect((await api.app.inject({ method: 'GET', url: '/metrics', remoteAddress: '::1' })).statusCode).toBe(200);
  });

  it('with a metrics token, answers whoever sends it, from anywhere, and no one else', async () => {
    const app = await buildApp({ config: { ...testConfig, metricsToken: METRICS_TOKEN, workers: 0 }, store: api.database.store });
    try {
      const from = (headers: Record<string, string>) => app.inject({ method: 'GET', url: '/metrics', remoteAddress: '10.1.2.3', headers });
      expect((await from({})).statusCode).toBe(401);
      expect((await from(bearer(s.instructorToken))).statusCode).toBe(401);
      const res = await from(bearer(METRICS_TOKEN));
      expect(res.statusCode).toBe(200);
      expect(parsePrometheusText(res.body).get('rateproof_worker_pool_threads_max')?.type).toBe('gauge');
      // Loopback needs it as well once it is set.
      expect((await app.inject({ method: 'GET', url: '/metrics' })).statusCode).toBe(401);
    } finally {
      await app.close();
    }
  });
});
