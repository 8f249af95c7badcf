import { createReadStream, createWriteStream, mkdtempSync, type WriteStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import { once } from 'node:events';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';

/**
 * Values kept to the end of a long run, one JSON line each, in a temporary file rather than in memory:
 * on a course-wide file of 20,000 submissions what `check --out` keeps for its summary is 120 MB of
 * text, which would otherwise sit beside the workers drawing sheets. Read back once, line by line, so
 * that the text and the values read from it are never all in memory together.
 */
export class KeptLines<T> {
  private file: { dir: string; stream: WriteStream } | undefined;
  private failure: Error | undefined;

  /** Appends one value: values are read back in the order of these calls. */
  push(value: T): void {
    this.pushLines(`${JSON.stringify(value)}\n`);
  }

  /** Appends values already written as `push` writes them (each one's JSON and a line break), as made in a worker. */
  pushLines(lines: string): void {
    if (!this.file) {
      this.file = openFile();
      this.file.stream.on('error', (error) => (this.failure ??= error));
    }
    if (this.failure) throw this.failure;
    this.file.stream.write(lines);
  }

  /** Resolves when the file's buffer has room again: what was pushed is on its way to the disk, not held. */
  async flushed(): Promise<void> {
    const stream = this.file?.stream;
    if (stream?.writableNeedDrain) await once(stream, 'drain');
    if (this.failure) throw this.failure;
  }

  /** Every value pushed, in order; the file is removed afterwards. */
  async *drain(): AsyncGenerator<T> {
    const file = this.file;
    if (!file) return;
    this.file = undefined;
    try {
      file.stream.end();
      await once(file.stream, 'close');
      if (this.failure) throw this.failure;
      for await (const line of createInterface({ input: createReadStream(file.stream.path), crlfDelay: Infinity })) yield JSON.parse(line) as T;
    } finally {
      await rm(file.dir, { recursive: true, force: true });
    }
  }

  /** Removes the file without reading it (after a failure). */
  async discard(): Promise<void> {
    const file = this.file;
    this.file = undefined;
    if (!file) return;
    file.stream.destroy();
    await rm(file.dir, { recursive: true, force: true });
  }
}

function openFile(): { dir: string; stream: WriteStream } {
  const dir = mkdtempSync(join(tmpdir(), 'rateproof-kept-'));
  const stream = createWriteStream(join(dir, 'kept.jsonl'));
  return { dir, stream };
}
