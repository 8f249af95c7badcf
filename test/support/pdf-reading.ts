import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/**
 * Reads a PDF held in memory with pdf.js (Mozilla's PDF reader, from the registry), so that tests of
 * what a sheet says need no program beside the repository. Rendering a page to pixels is a separate
 * check (poppler.ts) that says when poppler is absent.
 */

async function open(pdf: Buffer) {
  // pdf.js takes ownership of the array it is given: hand it a copy.
  return getDocument({ data: new Uint8Array(pdf), useSystemFonts: false, isEvalSupported: false, verbosity: 0 }).promise;
}

/**
 * The text of every page in drawing order, pages separated by a form feed (as pdftotext does). Pieces
 * are joined as drawn: a line break where pdf.js sees one or the next piece stands on another line, a space where a gap separates two pieces
 * (a right-aligned label, a table cell), nothing where one piece continues the other.
 */
export async function pdfText(pdf: Buffer): Promise<string> {
  const doc = await open(pdf);
  try {
    const pages: string[] = [];
    for (let n = 1; n <= doc.numPages; n++) {
      const content = await (await doc.getPage(n)).getTextContent();
      let text = '';
      let end: { x: number; y: number } | undefined;
      for (const item of content.items) {
        if (!('str' in item)) continue;
        const [, , , , x, y] = item.transform as number[];
        // A sub- or superscript sits a little off its line; a right-aligned label may be drawn before the text to its left.
        if (end && !/\s$/.test(text) && !/^\s/.test(item.str)) {
          if (Math.abs(y - end.y) > 0.5 * item.height) text += '\n';
          else if (Math.abs(x - end.x) > 0.2 * item.height) text += ' ';
        }
        text += item.str + (item.hasEOL ? '\n' : '');
        end = item.hasEOL ? undefined : { x: x + item.width, y };
      }
      pages.push(text);
    }
    return pages.join('\f');
  } finally {
    await doc.destroy();
  }
}

/** Whitespace folded to single spaces, for phrases that wrap across lines. */
export const folded = (text: string): string => text.replace(/\s+/g, ' ');

export async function pageCount(pdf: Buffer): Promise<number> {
  const doc = await open(pdf);
  try {
    return doc.numPages;
  } finally {
    await doc.destroy();
  }
}

export interface PdfFont {
  name: string;
  embedded: boolean;
}

/**
 * The fonts a PDF names, read from its object dictionaries (which pdfkit writes uncompressed): a font
 * is embedded when a font descriptor of the same name carries a font file (ISO 32000-1, 9.8).
 */
export function pdfFonts(pdf: Buffer): PdfFont[] {
  const body = pdf.toString('latin1');
  const names = new Set([...body.matchAll(/\/BaseFont\s*\/([^\s/<>[\]()]+)/g)].map((m) => m[1]));
  const descriptors = [...body.matchAll(/<<(?:(?!>>)[\s\S])*?\/Type\s*\/FontDescriptor[\s\S]*?>>/g)].map((m) => m[0]);
  return [...names].map((name) => ({
    name,
    embedded: descriptors.some((d) => d.includes(`/FontName /${name}`) && /\/FontFile[23]?\s/.test(d)),
  }));
}
