import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { hostname, tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DataFolderInUse, LOCK_FILE, lockDataFolder } from '../../server/store/data-folder-lock.ts';
import { serve } from '../support/serve-process.ts';
import { caught } from '../support/thrown.ts';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'rateproof-lock-'));
});
afterAll(async () => rm(dir, { recursive: true, force: true }));

/** The pid of a process that has run and exited: a lock naming it is stale. */
async function deadPid(): Promise<number> {
  const child = spawn(process.execPath, ['-e', '0']);
  await new Promise((resolve) => child.on('exit', resolve));
  return child.pid!;
}

describe('lockDataFolder', () => {
  it('takes the folder, refuses a second taker naming the folder and the holder, and gives it back', async () => {
    const folder = await mkdtemp(join(dir, 'a-'));
    const release = lockDataFolder(folder);
    expect(JSON.parse(await readFile(join(folder, LOCK_FILE), 'utf8'))).toMatchObject({ pid: process.pid, host: hostname() });
    const refused = caught(() => lockDataFolder(folder));
    expect(refused).toBeInstanceOf(DataFolderInUse);
    expect((refused as Error).message).toContain(`the data folder ${folder} is in use by process ${process.pid}`);
    release();
    expect(existsSync(join(folder, LOCK_FILE))).toBe(false);
    lockDataFolder(folder)();
  });

  it('takes over a lock whose process is gone (a crash)', async () => {
    const folder = await mkdtemp(join(dir, 'b-'));
    await writeFile(join(folder, LOCK_FILE), JSON.stringify({ pid: await deadPid(), host: hostname(), since: '2026-01-01T00:00:00Z' }));
    const release = lockDataFolder(folder);
    expect(JSON.parse(await readFile(join(folder, LOCK_FILE), 'utf8')).pid).toBe(process.pid);
    release();
  });
});

describe('two service processes on one embedded data folder', () => {
  it('the second refuses to start with one line naming the folder and the first; after a crash of the first, a restart works', async () => {
    const folder = join(dir, 'served');
    const first = serve({ RATEPROOF_DATA_DIR: folder });
    const port = await first.listening;
    const second = serve({ RATEPROOF_DATA_DIR: folder });
    const { code, stderr } = await second.exited;
    expect(code).toBe(1);
    expect(stderr).toBe(`rateproof: the data folder ${folder} is in use by process ${first.child.pid} on ${hostname()} (since ${JSON.parse(await readFile(join(folder, LOCK_FILE), 'utf8')).since}); stop that process first, or choose another RATEPROOF_DATA_DIR\n`);
    expect((await fetch(`http://127.0.0.1:${port}/health`)).status).toBe(200);

    first.child.kill('SIGKILL');
    await first.exited;
    const third = serve({ RATEPROOF_DATA_DIR: folder });
    const again = await third.listening;
    expect((await fetch(`http://127.0.0.1:${again}/health`)).status).toBe(200);
    third.child.kill('SIGTERM');
    expect((await third.exited).code).toBe(0);
    expect(existsSync(join(folder, LOCK_FILE))).toBe(false);
  }, 60_000);
});
