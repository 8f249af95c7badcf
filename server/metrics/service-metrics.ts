import { collectDefaultMetrics, Gauge, Histogram, Registry } from 'prom-client';
import { JOB_STATES, type JobQueue, type JobWatch } from '../jobs/job-queue.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import type { PoolConnections, Store } from '../store/connection.ts';

/**
 * One service's metrics, in the Prometheus text format: requests by route pattern, jobs, the
 * worker pool and the database's connection pool, with the process's own (CPU, memory, event loop).
 * No label holds a value a client sent: routes are the table's patterns, never a URL.
 */
export interface ServiceMetrics {
  /** Observes a request's duration once it is answered. */
  requestSeconds: Histogram<'method' | 'route' | 'status_class'>;
  /** Times each job's try in this process. */
  jobWatch: JobWatch;
  /** Counts the queue's jobs by state when read (the counts are the database's, the same from every process). */
  countJobs(queue: Pick<JobQueue, 'counts'>): void;
  contentType: string;
  text(): Promise<string>;
}

// The process's metrics are collected once per process (their observers stay for its life), however
// many apps it builds; each app's registry is merged with them when read.
let processRegistry: Registry | undefined;
function processMetrics(): Registry {
  if (!processRegistry) {
    processRegistry = new Registry();
    collectDefaultMetrics({ register: processRegistry });
  }
  return processRegistry;
}

// A part of a regrade takes a second or a few; a cleanup or a passback about as long.
const JOB_BUCKETS = [0.1, 0.5, 1, 2.5, 5, 10, 20, 60, 300];

export function serviceMetrics(sources: { store: Store; pool?: WorkerPool }): ServiceMetrics {
  const registry = new Registry();
  const own = { registers: [registry] };

  const requestSeconds = new Histogram({
    ...own,
    name: 'rateproof_http_request_duration_seconds',
    help: 'Time to answer a request, by method, route pattern and status class.',
    labelNames: ['method', 'route', 'status_class'] as const,
  });

  const jobSeconds = new Histogram({
    ...own,
    name: 'rateproof_job_duration_seconds',
    help: "A job's try in this process, from taking it to its end, by queue and outcome.",
    labelNames: ['queue', 'outcome'] as const,
    buckets: JOB_BUCKETS,
  });
  const jobWatch: JobWatch = { ended: (queue, outcome, seconds) => jobSeconds.observe({ queue, outcome }, seconds) };
  const { pool, store } = sources;
  if (pool) {
    const poolGauge = (name: string, help: string, read: () => number) =>
      new Gauge({ ...own, name, help, collect() { this.set(read()); } });
    poolGauge('rateproof_worker_pool_threads_max', 'Worker threads the pool may start.', () => pool.size);
    poolGauge('rateproof_worker_pool_threads', 'Worker threads started (0 when the work runs in the service\'s own thread).', () => pool.use().threads);
    poolGauge('rateproof_worker_pool_busy_tasks', 'Checking or drawing tasks being worked on.', () => pool.use().busy);
    poolGauge('rateproof_worker_pool_queued_tasks', 'Tasks waiting for a free worker thread.', () => pool.use().queued);
  }
  const connections = store.connections;
  if (connections) {
    const dbGauge = (name: string, help: string, read: (c: PoolConnections) => number) =>
      new Gauge({ ...own, name, help, collect() { this.set(read(connections())); } });
    dbGauge('rateproof_db_pool_connections', 'Open connections to PostgreSQL, in use or idle.', (c) => c.total);
    dbGauge('rateproof_db_pool_idle_connections', 'Open connections to PostgreSQL not in use.', (c) => c.idle);
    dbGauge('rateproof_db_pool_waiting_queries', 'Queries waiting for a connection (every one in use, the pool at its maximum).', (c) => c.waiting);
    dbGauge('rateproof_db_pool_max_connections', 'The most connections the pool opens.', (c) => c.max);
  }

  // Registered after the pool gauges: its query, on read, must not count among the queries they see waiting.
  let queue: Pick<JobQueue, 'counts'> | undefined;
  new Gauge({
    ...own,
    name: 'rateproof_jobs',
    help: 'Jobs in the shared queue by queue and state (archived ones left out).',
    labelNames: ['queue', 'state'] as const,
    async collect() {
      if (!queue) return;
      // With the database away the counts are left out; /metrics answers still (/ready says why).
      const counts = await queue.counts().catch(() => ({}));
      this.reset();
      for (const [name, states] of Object.entries(counts)) for (const state of JOB_STATES) this.set({ queue: name, state }, states[state] ?? 0);
    },
  });

  const merged = Registry.merge([processMetrics(), registry]);
  return { requestSeconds, jobWatch, countJobs: (q) => void (queue = q), contentType: merged.contentType, text: () => merged.metrics() };
}
