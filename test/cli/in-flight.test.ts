import { describe, expect, it } from 'vitest';
import { InFlight } from '../../server/cli/in-flight.ts';

const tick = () => new Promise<void>((resolve) => setTimeout(resolve, 1));

describe('tasks in flight', () => {
  it('never has more than the limit pending, and done waits for the last', async () => {
    const tasks = new InFlight(3);
    let pending = 0;
    let most = 0;
    let finished = 0;
    for (let i = 0; i < 10; i++) {
      await tasks.add(async () => {
        most = Math.max(most, ++pending);
        await tick();
        pending--;
        finished++;
      });
    }
    await tasks.done();
    expect(most).toBe(3);
    expect(finished).toBe(10);
  });

  it('keeps a failure for the next wait, even one that ended before it, and never lets it be an unhandled rejection', async () => {
    const unhandled: unknown[] = [];
    const listener = (reason: unknown) => unhandled.push(reason);
    process.on('unhandledRejection', listener);
    try {
      const tasks = new InFlight(2);
      await tasks.add(async () => {
        await tick();
        throw new Error('disk full');
      });
      await tick();
      await tick();
      // Ended before anyone waited: the next task is refused, and done says why.
      await expect(tasks.add(async () => {})).rejects.toThrow('disk full');
      await expect(tasks.done()).rejects.toThrow('disk full');
      await tasks.settled();
      expect(unhandled).toEqual([]);
    } finally {
      process.off('unhandledRejection', listener);
    }
  });
});
