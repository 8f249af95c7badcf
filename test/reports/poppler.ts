import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';

/** poppler-utils (pdftotext, pdftoppm, pdffonts) on a PDF held in memory; .ci/run installs them. */
const run = promisify(execFile);

async function withFile<T>(pdf: Buffer, use: (path: string, dir: string) => Promise<T>): Promise<T> {
  const dir = await mkdtemp(join(tmpdir(), 'rateproof-pdf-'));
  try {
    const path = join(dir, 'doc.pdf');
    await writeFile(path, pdf);
    return await use(path, dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** The text in reading order (pdftotext -layout off), UTF-8. */
export function pdfText(pdf: Buffer): Promise<string> {
  return withFile(pdf, async (path) => (await run('pdftotext', ['-enc', 'UTF-8', path, '-'], { maxBuffer: 1 << 24 })).stdout);
}

/** Whitespace folded to single spaces, for phrases that wrap across lines. */
export const folded = (text: string): string => text.replace(/\s+/g, ' ');

export async function pageCount(pdf: Buffer): Promise<number> {
  return withFile(pdf, async (path) => Number(/Pages:\s+(\d+)/.exec((await run('pdfinfo', [path])).stdout)?.[1]));
}

/** The fonts pdffonts lists: name, type, embedded. */
export function pdfFonts(pdf: Buffer): Promise<string> {
  return withFile(pdf, async (path) => (await run('pdffonts', [path])).stdout);
}

/** Page `page` rendered to PNG at `dpi`. */
export function pagePng(pdf: Buffer, page = 1, dpi = 50): Promise<Buffer> {
  return withFile(pdf, async (path, dir) => {
    await run('pdftoppm', ['-png', '-r', String(dpi), '-f', String(page), '-l', String(page), '-singlefile', path, join(dir, 'page')]);
    return readFile(join(dir, 'page.png'));
  });
}

export const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** Width and height from a PNG's IHDR chunk. */
export function pngSize(png: Buffer): { width: number; height: number } {
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}
