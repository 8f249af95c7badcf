import { tasks, type TaskInput, type TaskName, type TaskOutput } from './tasks.ts';
import type { WorkerPool } from './worker-pool.ts';

/**
 * The pool's tasks run in the calling thread, one at a time: for a machine with a single core, where
 * a worker thread would only add its start-up.
 */
export function sameThreadPool(): WorkerPool {
  let busy = 0;
  return {
    size: 1,
    // Tasks do not wait for one another here: every one under way counts as busy, none as queued.
    use: () => ({ threads: 0, busy, queued: 0 }),
    async run<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskOutput<N>> {
      busy++;
      try {
        const task = (await tasks[name]()) as (input: TaskInput<N>) => TaskOutput<N> | Promise<TaskOutput<N>>;
        // Structured clone, as a worker's input would be: the task may not keep or change the caller's objects.
        return await task(structuredClone(input));
      } finally {
        busy--;
      }
    },
    async close() {},
  };
}
