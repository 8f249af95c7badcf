import { createWriteStream, mkdtempSync, type WriteStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import { once } from 'node:events';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { jsonLinesOf } from '../batches/json-lines-file.ts';

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
    try {
      const path = await this.written();
      if (path !== undefined) yield* jsonLinesOf<T>(path);
    } finally {
      await this.discard();
    }
  }

  /**
   * Ends the writing: the path of the file of every value pushed, one JSON line each in order, for
   * another thread to read (`jsonLinesOf`); undefined when nothing was pushed. The file stays until
   * `discard`.
   */
  async written(): Promise<string | undefined> {
    const stream = this.file?.stream;
    if (!stream) return undefined;
    if (!stream.closed) {
      stream.end();
      await once(stream, 'close');
    }
    if (this.failure) throw this.failure;
    return String(stream.path);
  }

  /** Removes the file, read or not. */
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
