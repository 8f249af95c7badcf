import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { KeptLines } from '../../server/cli/kept-lines.ts';

// Each test gets its own temporary folder (os.tmpdir reads TMPDIR on every call), so that what the
// kept values leave behind can be seen.
let folder: string;
let before: string | undefined;
beforeEach(() => {
  before = process.env.TMPDIR;
  folder = mkdtempSync(join(tmpdir(), 'kept-lines-test-'));
  process.env.TMPDIR = folder;
});
afterEach(() => {
  if (before === undefined) delete process.env.TMPDIR;
  else process.env.TMPDIR = before;
  rmSync(folder, { recursive: true, force: true });
});

const drained = async <T>(kept: KeptLines<T>) => {
  const values: T[] = [];
  for await (const value of kept.drain()) values.push(value);
  return values;
};

describe('values kept in a temporary file', () => {
  it('reads back every value pushed, in order and equal to what was pushed, then removes its file', async () => {
    const kept = new KeptLines<[{ id: string; score: number; text: string }] | [{ id: string; score: number; text: string }, number[]]>();
    const pushed: Array<[{ id: string; score: number; text: string }] | [{ id: string; score: number; text: string }, number[]]> = [];
    for (let i = 0; i < 5000; i++) {
      // Text that needs escaping and characters beyond ASCII, a line break among them: one value must stay one line.
      const value = { id: `S${i}`, score: i / 7, text: `k = 1.5×10⁻³ "min⁻¹"\n${'x'.repeat(i % 300)}` };
      const entry: (typeof pushed)[number] = i % 3 === 0 ? [value] : [value, [i, -i, 0.1 * i]];
      kept.push(entry);
      pushed.push(entry);
      if (i % 500 === 499) await kept.flushed();
    }
    expect(readdirSync(folder)).toHaveLength(1);
    expect(await drained(kept)).toEqual(pushed);
    expect(readdirSync(folder)).toEqual([]);
  });

  it('reads back nothing when nothing was pushed, and leaves no file', async () => {
    const kept = new KeptLines<number>();
    expect(await drained(kept)).toEqual([]);
    expect(readdirSync(folder)).toEqual([]);
  });

  it('removes its file when discarded after a failure', async () => {
    const kept = new KeptLines<number>();
    kept.push(1);
    await kept.flushed();
    await kept.discard();
    expect(readdirSync(folder)).toEqual([]);
  });
});
