import { availableParallelism } from 'node:os';
import { Worker, type ResourceLimits } from 'node:worker_threads';
import type { TaskName, TaskInput, TaskOutput } from './tasks.ts';

/**
 * A fixed set of worker threads for the CPU-bound work (checking, rendering sheets), so that the
 * command uses every core and the service's event loop never waits on a batch. Workers start on the
 * first task and stay until `close`; each keeps its loaded modules, fonts and parsed settings.
 */
export interface WorkerPool {
  run<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskOutput<N>>;
  readonly size: number;
  /** How the pool is used just now (read by the metrics). */
  use(): PoolUse;
  close(): Promise<void>;
}

export interface PoolUse {
  /** Threads started (they start on demand, up to `size`). */
  threads: number;
  /** Tasks being worked on. */
  busy: number;
  /** Tasks waiting for a free thread. */
  queued: number;
}

interface Job {
  id: number;
  name: TaskName;
  input: unknown;
  resolve(value: unknown): void;
  reject(error: Error): void;
}

interface Slot {
  worker: Worker;
  job?: Job;
}

type Reply = { id: number; output: unknown } | { id: number; error: { message: string; name: string } };

// The build runs as JavaScript. Sources run under tsx (tests, development): a worker registers tsx's
// loader before it imports the TypeScript worker module.
const fromSource = import.meta.url.endsWith('.ts');
const workerModule = new URL(fromSource ? './pool-worker.ts' : './pool-worker.js', import.meta.url);

// Checking allocates many short-lived objects; a young generation of 64 MB (V8's default is 16) means
// fewer collections, about a tenth less time on a corpus of 20,000 submissions.
const CHECKING_LIMITS: ResourceLimits = { maxYoungGenerationSizeMb: 64 };

/**
 * For a long run of sheets, where memory matters more than the checking's speed: a worker drawing
 * sheets holds about 30 MB after a full collection, but V8 let its heap grow to several times that
 * between collections (2,000 sheets with two workers: 449 MB at the peak; with a 128 MB bound 273 MB).
 * Over 20,000 sheets the whole process still rose by 130 MB under a 128 MB bound. A worker that checks
 * and draws its batch holds some 40 MB: 56 MB of old generation cost no time on 2,000 (37 CPU s against
 * 37-39 with 64 MB); a young generation of 8 MB took 30 % more CPU, and is not used.
 */
export const SHEET_LIMITS: ResourceLimits = { maxYoungGenerationSizeMb: 16, maxOldGenerationSizeMb: 56 };

function newWorker(resourceLimits: ResourceLimits): Worker {
  if (!fromSource) return new Worker(workerModule, { resourceLimits });
  const boot = `import('tsx/esm/api').then((tsx) => { tsx.register(); return import(${JSON.stringify(workerModule.href)}); });`;
  return new Worker(boot, { eval: true, resourceLimits });
}

/** A task that failed in a worker: the worker's error name and message. */
export class WorkerTaskError extends Error {
  constructor(message: string, readonly taskErrorName: string) {
    super(message);
  }
}

export function createWorkerPool(size = availableParallelism(), resourceLimits = CHECKING_LIMITS): WorkerPool {
  const slots: Slot[] = [];
  const queue: Job[] = [];
  let nextId = 1;
  let closed = false;

  const start = (): Slot => {
    const worker = newWorker(resourceLimits);
    const slot: Slot = { worker };
    worker.on('message', (reply: Reply) => {
      const job = slot.job;
      slot.job = undefined;
      if (job) {
        if ('error' in reply) job.reject(new WorkerTaskError(reply.error.message, reply.error.name));
        else job.resolve(reply.output);
      }
      dispatch();
    });
    worker.on('error', (error) => {
      // A worker that dies takes its task with it; a new one takes its place for the rest.
      slot.job?.reject(error);
      slots.splice(slots.indexOf(slot), 1);
      dispatch();
    });
    worker.unref();
    slots.push(slot);
    return slot;
  };

  const dispatch = () => {
    while (queue.length > 0) {
      const slot = slots.find((s) => !s.job) ?? (slots.length < size ? start() : undefined);
      if (!slot) return;
      const job = queue.shift()!;
      slot.job = job;
      slot.worker.ref();
      slot.worker.postMessage({ id: job.id, name: job.name, input: job.input });
    }
    // Idle workers must not keep a finished command alive.
    for (const slot of slots) if (!slot.job) slot.worker.unref();
  };

  return {
    size,
    use: () => ({ threads: slots.length, busy: slots.filter((s) => s.job).length, queued: queue.length }),
    run(name, input) {
      if (closed) return Promise.reject(new Error('the worker pool is closed'));
      return new Promise((resolve, reject) => {
        queue.push({ id: nextId++, name, input, resolve: resolve as (v: unknown) => void, reject });
        dispatch();
      });
    },
    async close() {
      closed = true;
      for (const job of queue.splice(0)) job.reject(new Error('the worker pool is closed'));
      await Promise.all(slots.splice(0).map((s) => s.worker.terminate()));
    },
  };
}
