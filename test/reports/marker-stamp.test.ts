import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { collect, createDocument, finish } from '../../reports/pdf/document.ts';
import { marker, markerStamp, type MarkerShape } from '../../reports/pdf/marks.ts';

const DATE = new Date('2025-03-04T14:30:00Z');

/** Every stream of a PDF, inflated by zlib (each is deflated, as the PDF's /FlateDecode says), with the dictionary before it. */
function streams(pdf: Buffer): Array<{ dictionary: string; content: string }> {
  const text = pdf.toString('latin1');
  const found: Array<{ dictionary: string; content: string }> = [];
  for (let at = text.indexOf('stream\n'); at >= 0; at = text.indexOf('stream\n', at + 1)) {
    if (text.slice(at - 3, at) === 'end') continue;
    const end = text.indexOf('\nendstream', at);
    const dictionary = text.slice(text.lastIndexOf(' obj', at), at);
    found.push({ dictionary, content: inflateSync(pdf.subarray(at + 'stream\n'.length, end)).toString('latin1') });
  }
  return found;
}

async function drawn(draw: (doc: ReturnType<typeof createDocument>) => void): Promise<Buffer> {
  const doc = createDocument({ title: 'marks', date: DATE });
  const bytes = collect(doc);
  draw(doc);
  finish(doc, { left: 'marks', title: 'marks' });
  return bytes;
}

describe('markerStamp', () => {
  it.each<MarkerShape>(['disc', 'diamond'])('a %s placed by a form draws what marker() draws, moved to its place', async (shape) => {
    // pdfkit's own drawing of the marker at the origin is the reference for the form's content.
    const plain = streams(await drawn((doc) => marker(doc, shape, 0, 0, 4, '#336699')));
    const stampedPdf = await drawn((doc) => markerStamp(doc, shape, 4, '#336699')(100, 200));
    const stamped = streams(stampedPdf);
    const form = stamped.find((s) => s.dictionary.includes('/Subtype /Form'));
    expect(form).toBeDefined();
    // The page of the plain drawing holds the marker's operators; the form holds exactly those.
    expect(plain.some((s) => s.content.includes(form!.content.trim()))).toBe(true);
    // The page places the form with a translation to the mark's point (PDF 1.7, 8.3.4 and 8.10, from memory).
    // The page's resources name the form.
    const name = /\/XObject <<\n?\/(Mk\d+) \d+ 0 R/.exec(stampedPdf.toString('latin1'))![1];
    expect(stamped.some((s) => s.content.includes(`q\n1 0 0 1 100 200 cm\n/${name} Do\nQ`))).toBe(true);
  });
});
