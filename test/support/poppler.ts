import { execFile, execFileSync } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';

/**
 * Rendering a PDF page to pixels with poppler's pdftoppm: the one check that needs a program beside
 * the repository. Reading a PDF's text needs none (pdf-reading.ts).
 */
const run = promisify(execFile);

function found(): boolean {
  try {
    execFileSync('pdftoppm', ['-v'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

/** Whether pdftoppm runs here; a rendering test is skipped, saying why, when it does not. */
export const popplerPresent = found();
export const POPPLER_ABSENT = 'poppler (pdftoppm) is not installed: page rendering is not checked on this machine';

/** Page `page` rendered to PNG at `dpi`. */
export async function pagePng(pdf: Buffer, page = 1, dpi = 50): Promise<Buffer> {
  const dir = await mkdtemp(join(tmpdir(), 'rateproof-pdf-'));
  try {
    const path = join(dir, 'doc.pdf');
    await writeFile(path, pdf);
    await run('pdftoppm', ['-png', '-r', String(dpi), '-f', String(page), '-l', String(page), '-singlefile', path, join(dir, 'page')]);
    return await readFile(join(dir, 'page.png'));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

export const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** Width and height from a PNG's IHDR chunk. */
export function pngSize(png: Buffer): { width: number; height: number } {
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}
