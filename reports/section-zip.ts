import type { PassThrough, Readable } from 'node:stream';
// yazl (pinned 3.3.1): a small, long-maintained ZIP writer by the author of yauzl, with one dependency
// (buffer-crc32), streaming output and ZIP64 for large archives; it works on Node 20 as it is. archiver
// would also do, but brings a dozen dependencies (async, readable-stream, glob ...) for features not used here.
import { ZipFile } from 'yazl';
import type { FeedbackHeader } from './feedback-input.ts';
import { sheetDocumentName, UniqueNames } from './file-names.ts';

export interface ZipEntry {
  /** The sheet's header, which names its entry as the sheet downloads alone (`sheetDocumentName`). */
  input: { header: FeedbackHeader };
  pdf: Buffer;
}

/**
 * A ZIP of feedback PDFs, streamed as the entries arrive: each is stored without recompression (a PDF's
 * streams are already deflated), so it is written at once and the next entry is pulled only when the
 * reader has taken the output (backpressure). Each entry is named for what it is, as the sheet downloads
 * alone (`<course>-<section>-<assignment>-<id>-v<version>-feedback.pdf`), and unique (`…-feedback-2.pdf` for a repeat).
 * An error from `entries` destroys the stream with that error.
 */
export function sectionZip(entries: AsyncIterable<ZipEntry> | Iterable<ZipEntry>): Readable {
  const zip = new ZipFile();
  // yazl's output is a PassThrough; its types only say NodeJS.ReadableStream.
  const output = zip.outputStream as unknown as PassThrough;
  const names = new UniqueNames();
  const waitForReader = () =>
    new Promise<void>((resolve) => {
      const done = () => {
        output.off('drain', done);
        output.off('close', done);
        resolve();
      };
      output.once('drain', done);
      output.once('close', done);
    });

  void (async () => {
    try {
      for await (const entry of entries) {
        if (output.destroyed) return;
        zip.addBuffer(entry.pdf, names.take(sheetDocumentName(entry.input.header).ascii), { compress: false });
        if (output.writableNeedDrain) await waitForReader();
        if (output.destroyed) return;
      }
      zip.end();
    } catch (error) {
      output.destroy(error instanceof Error ? error : new Error(String(error)));
    }
  })();
  return output;
}
