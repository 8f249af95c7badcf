import { collectDefaultMetrics, Counter, Gauge, Histogram, Registry } from 'prom-client';
import type { RegradeWatch } from '../grading/regrade.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import type { PoolConnections, Store } from '../store/connection.ts';

/**
 * One service's metrics, in the Prometheus text format: requests by route pattern, regrades, the
 * worker pool and the database's connection pool, with the process's own (CPU, memory, event loop).
 * No label holds a value a client sent: routes are the table's patterns, never a URL.
 */
export interface ServiceMetrics {
  /** Observes a request's duration once it is answered. */
  requestSeconds: Histogram<'method' | 'route' | 'status_class'>;
  regradeWatch: RegradeWatch;
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

// A regrade of a section takes seconds, of a whole course minutes.
const REGRADE_BUCKETS = [1, 5, 15, 30, 60, 120, 300, 600, 1800];

export function serviceMetrics(sources: { store: Store; pool?: WorkerPool }): ServiceMetrics {
  const registry = new Registry();
  const own = { registers: [registry] };

  const requestSeconds = new Histogram({
    ...own,
    name: 'rateproof_http_request_duration_seconds',
    help: 'Time to answer a request, by method, route pattern and status class.',
    labelNames: ['method', 'route', 'status_class'] as const,
  });

  const regradesRunning = new Gauge({ ...own, name: 'rateproof_regrades_running', help: 'Regrades under way in this process.' });
  const regradesEnded = new Counter({ ...own, name: 'rateproof_regrades_ended_total', help: 'Regrades ended in this process, by how they ended.', labelNames: ['state'] as const });
  const regradeSeconds = new Histogram({ ...own, name: 'rateproof_regrade_duration_seconds', help: 'Time from a regrade\'s start to its end.', labelNames: ['state'] as const, buckets: REGRADE_BUCKETS });
  // Both states appear from the start, at 0, so that a rate over them is defined before the first regrade.
  for (const state of ['finished', 'failed']) regradesEnded.inc({ state }, 0);
  const regradeWatch: RegradeWatch = {
    started: () => regradesRunning.inc(),
    ended(job) {
      regradesRunning.dec();
      regradesEnded.inc({ state: job.status });
      regradeSeconds.observe({ state: job.status }, ((job.finishedAt ?? new Date()).getTime() - job.startedAt.getTime()) / 1000);
    },
  };

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

  const merged = Registry.merge([processMetrics(), registry]);
  return { requestSeconds, regradeWatch, contentType: merged.contentType, text: () => merged.metrics() };
}
