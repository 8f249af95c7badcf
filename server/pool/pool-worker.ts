import { parentPort } from 'node:worker_threads';
import { tasks, type TaskName } from './tasks.ts';
import { movedBuffers } from '../batches/moved-buffers.ts';

/** A pool worker: runs each task it is sent and answers with its output or its error. */
parentPort!.on('message', async ({ id, name, input }: { id: number; name: TaskName; input: never }) => {
  try {
    const run = (await tasks[name]()) as (input: never) => unknown;
    const output = await run(input);
    parentPort!.postMessage({ id, output }, movedBuffers(output));
  } catch (error) {
    const e = error instanceof Error ? error : new Error(String(error));
    parentPort!.postMessage({ id, error: { name: e.constructor.name, message: e.message } });
  }
});
