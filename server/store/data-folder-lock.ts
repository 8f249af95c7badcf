import { closeSync, openSync, readFileSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';

/**
 * One process at a time on an embedded data folder: two would each hand out the same ids and lose
 * each other's writes. The lock is a file naming the holder's process id; a lock whose process is gone
 * (a crash, a power cut) is stale and taken over.
 */
export class DataFolderInUse extends Error {
  override readonly name = 'DataFolderInUse';
  constructor(
    readonly folder: string,
    readonly holder: { pid: number; host: string; since: string },
  ) {
    super(`the data folder ${folder} is in use by process ${holder.pid} on ${holder.host} (since ${holder.since}); stop that process first, or choose another RATEPROOF_DATA_DIR`);
  }
}

export const LOCK_FILE = 'rateproof.lock';

interface Holder {
  pid: number;
  host: string;
  since: string;
}

function readHolder(path: string): Holder | undefined {
  try {
    const holder = JSON.parse(readFileSync(path, 'utf8')) as Partial<Holder>;
    return typeof holder.pid === 'number' ? { pid: holder.pid, host: String(holder.host), since: String(holder.since) } : undefined;
  } catch {
    return undefined;
  }
}

function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else.
    return (error as { code?: string }).code === 'EPERM';
  }
}

/** Takes the folder's lock or throws DataFolderInUse; returns the function that gives it back. */
export function lockDataFolder(folder: string): () => void {
  const path = join(folder, LOCK_FILE);
  const me: Holder = { pid: process.pid, host: hostname(), since: new Date().toISOString() };
  for (let attempt = 0; ; attempt++) {
    try {
      const fd = openSync(path, 'wx');
      writeSync(fd, JSON.stringify(me));
      closeSync(fd);
      break;
    } catch (error) {
      if ((error as { code?: string }).code !== 'EEXIST' || attempt > 0) throw error;
      const holder = readHolder(path);
      // A lock from another machine (a shared folder) cannot be checked here: it is respected. So is
      // this process's own: two embedded databases on one folder in one process collide just the same.
      if (holder && (holder.host !== me.host || running(holder.pid))) throw new DataFolderInUse(folder, holder);
      unlinkSync(path);
    }
  }
  let held = true;
  const release = () => {
    if (!held) return;
    held = false;
    process.off('exit', release);
    try {
      if (readHolder(path)?.pid === process.pid) unlinkSync(path);
    } catch {
      // Already gone: nothing to give back.
    }
  };
  process.on('exit', release);
  return release;
}
