import { describe, expect, it } from 'vitest';
import { collect, compactPage, createDocument, finish } from '../../reports/pdf/document.ts';
import { marker } from '../../reports/pdf/marks.ts';

const DATE = new Date('2025-03-04T14:30:00Z');

/** A page of many marks, the page joined into one piece every `every` marks (never: 0). */
async function marks(every: number): Promise<{ pdf: Buffer; pieces: number }> {
  const doc = createDocument({ title: 'marks', date: DATE });
  const bytes = collect(doc);
  for (let i = 0; i < 3000; i++) {
    marker(doc, i % 2 ? 'disc' : 'diamond', 60 + (i % 400), 100 + (i % 500), 4, '#336699');
    if (every > 0 && i % every === every - 1) compactPage(doc);
  }
  const pieces = ((doc.page as unknown as { content: { buffer: unknown[] } }).content.buffer).length;
  finish(doc, { left: 'marks', title: 'marks' });
  return { pdf: await bytes, pieces };
}

describe('compactPage', () => {
  it('keeps a page of many marks in a few pieces, and the document byte for byte the same', async () => {
    const [kept, joined] = await Promise.all([marks(0), marks(1000)]);
    // pdfkit's own output, drawn without joining, is the reference.
    expect(joined.pdf.equals(kept.pdf)).toBe(true);
    // Hand-counted: 3,000 marks joined after every 1,000, the last join after the last mark: a piece per 1,000.
    expect(joined.pieces).toBe(3);
    // Without joining, every operator of 3,000 marks is its own piece (several per mark).
    expect(kept.pieces).toBeGreaterThan(3000 * 3);
  });
});
