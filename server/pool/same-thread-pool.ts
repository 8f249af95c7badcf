import { tasks, type TaskInput, type TaskName, type TaskOutput } from './tasks.ts';
import type { WorkerPool } from './worker-pool.ts';

/**
 * The pool's tasks run in the calling thread, one at a time: for a machine with a single core, where
 * a worker thread would only add its start-up, and for a process that registered an experiment kind
 * at run time (workers load only the kinds built in).
 */
export function sameThreadPool(): WorkerPool {
  return {
    size: 1,
    async run<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskOutput<N>> {
      const task = (await tasks[name]()) as (input: TaskInput<N>) => TaskOutput<N> | Promise<TaskOutput<N>>;
      // Structured clone, as a worker's input would be: the task may not keep or change the caller's objects.
      return task(structuredClone(input));
    },
    async close() {},
  };
}
