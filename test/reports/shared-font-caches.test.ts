import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import * as fontkit from 'fontkit';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { collect, createDocument } from '../../reports/pdf/document.ts';
import { COLOR, PAGE, SIZE } from '../../reports/pdf/theme.ts';

/**
 * The sheet fonts share shaped strings and the font files' compressed streams between documents
 * (reports/pdf/fonts.ts). The reference here is pdfkit as shipped: the same drawing on a document
 * whose fonts are parsed afresh and registered the plain way, with no cache of ours, must give the
 * same bytes, for the first document and for one drawn after others have filled the caches.
 */

const fontFile = (name: string) => join(dirname(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/package.json')), 'ttf', name);

// The glyphs registerFonts includes first, written out again here as the plain document must include them.
const PRESET = [...Array.from({ length: 95 }, (_, i) => String.fromCharCode(32 + i)), ...'αΔ∞±°−×·—–“”‘’…⁻⁺⁰¹²³⁴⁵⁶⁷⁸⁹µ◀▶→≤≥'].join('');

const date = new Date(0);
const title = 'fonts';

/** pdfkit with freshly parsed fonts, set up as createDocument sets its document up. */
function plainDocument(): PDFKit.PDFDocument {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: { top: PAGE.margin, left: PAGE.margin, right: PAGE.margin, bottom: PAGE.margin + PAGE.footer },
    bufferPages: true,
    autoFirstPage: true,
    font: null as unknown as string,
    info: { Title: title, Creator: 'Rateproof', Producer: 'Rateproof', CreationDate: date, ModDate: date },
    lang: 'en',
  });
  for (const [name, file] of [['body', 'DejaVuSans.ttf'], ['body-bold', 'DejaVuSans-Bold.ttf']]) {
    doc.registerFont(name, fontkit.create(readFileSync(fontFile(file))) as unknown as Buffer);
    doc.font(name);
    (doc as unknown as { _font: { encode(text: string): unknown } })._font.encode(PRESET);
  }
  doc.font('body');
  doc.fillColor(COLOR.ink).fontSize(SIZE.body);
  return doc;
}

/** Labels measured and drawn as the sheets do, numbers that differ from document to document among them. */
function draw(doc: PDFKit.PDFDocument, n: number): void {
  doc.fillColor('#1b1f24').fontSize(9);
  for (const [i, text] of [`k_obs = ${(0.0123 * n).toFixed(5)} min⁻¹`, 'Reported against refit values', `S-${String(n).padStart(3, '0')} · AVA WAVE Ty 1.9 × 10⁻⁷`, 'x_∞ ± 0.002 — “quoted”'].entries()) {
    doc.font(i % 2 === 0 ? 'body' : 'body-bold');
    const width = doc.widthOfString(text);
    doc.text(text, 300 - width, 60 + 14 * i, { lineBreak: false });
  }
  doc.text(`A wrapped paragraph of plain words, measured by pdfkit's own line wrapper ${n} times over.`, 50, 200, { width: 120 });
}

async function bytesOf(doc: PDFKit.PDFDocument, n: number): Promise<Buffer> {
  const bytes = collect(doc);
  draw(doc, n);
  doc.end();
  return bytes;
}

describe('fonts shared between documents', () => {
  it('give the bytes pdfkit gives without them, with the caches cold and warm', async () => {
    // Check against the reference only where the comparison can fail: the plain document differs from
    // ours if a shaped string, a width or the font stream were reused wrongly.
    const first = await bytesOf(createDocument({ title, date }), 1);
    expect(first.equals(await bytesOf(plainDocument(), 1))).toBe(true);
    for (let n = 2; n < 6; n++) await bytesOf(createDocument({ title, date }), n);
    const warm = await bytesOf(createDocument({ title, date }), 7);
    const plain = await bytesOf(plainDocument(), 7);
    expect(warm.length).toBeGreaterThan(5000);
    expect(warm.equals(plain)).toBe(true);
  });
});
