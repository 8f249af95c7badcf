import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import * as fontkit from 'fontkit';

/**
 * DejaVu Sans, embedded (subset) in every PDF: pdfkit's built-in fonts have no α, ∞, ⁻¹ or −.
 * The parsed font is shared by all documents: parsing the 740 kB file per sheet would cost most of the
 * time a sheet takes. pdfkit 0.20 accepts a fontkit font in place of a file and subsets it per document
 * (fontkit is pinned to the version pdfkit itself depends on). Text shaping and subsets are shared
 * across documents too (see below).
 */

export const FONT = { regular: 'body', bold: 'body-bold' } as const;

type FontName = (typeof FONT)[keyof typeof FONT];

const FILES: Record<FontName, string> = { body: 'DejaVuSans.ttf', 'body-bold': 'DejaVuSans-Bold.ttf' };

let loaded: Record<FontName, fontkit.Font> | undefined;

function fontDirectory(): string {
  const require = createRequire(import.meta.url);
  return join(dirname(require.resolve('dejavu-fonts-ttf/package.json')), 'ttf');
}

interface Subset {
  glyphs: number[];
  encode(): Uint8Array;
}

const SUBSET_CACHE_LIMIT = 64;

/**
 * Subsetting a TrueType font (decoding and re-encoding every glyph) is the costliest step of a small
 * PDF. Every sheet uses nearly the same glyphs, and `registerFonts` makes each document include a
 * fixed set first, in a fixed order: so the subsets of most documents are identical, and their bytes
 * are made once and then reused.
 */
function withSubsetCache(font: fontkit.Font): fontkit.Font {
  const encoded = new Map<string, Uint8Array>();
  const create = (font as unknown as { createSubset(): Subset }).createSubset;
  (font as unknown as { createSubset(): Subset }).createSubset = function (this: unknown) {
    const subset = create.call(this);
    const encode = subset.encode.bind(subset);
    subset.encode = () => {
      const key = subset.glyphs.join(',');
      let bytes = encoded.get(key);
      if (!bytes) {
        bytes = encode();
        if (encoded.size >= SUBSET_CACHE_LIMIT) encoded.clear();
        encoded.set(key, bytes);
      }
      return bytes;
    };
    return subset;
  };
  return font;
}

function fonts(): Record<FontName, fontkit.Font> {
  if (!loaded) {
    const directory = fontDirectory();
    const load = (name: FontName) => withSubsetCache(fontkit.create(readFileSync(join(directory, FILES[name]))));
    loaded = { body: load('body'), 'body-bold': load('body-bold') };
  }
  return loaded;
}

/** The glyphs every document includes first: printable ASCII and the symbols the sheets print. */
const PRESET = [
  ...Array.from({ length: 95 }, (_, i) => String.fromCharCode(32 + i)),
  ...'αΔ∞±°−×·—–“”‘’…⁻⁺⁰¹²³⁴⁵⁶⁷⁸⁹µ◀▶→≤≥',
].join('');

interface EmbeddedFont {
  encode(text: string): unknown;
  layoutCache?: Record<string, unknown>;
}

/**
 * pdfkit shapes each word once per document and keeps the result in the font object's layoutCache;
 * the runs there are already scaled and are only read afterwards, so documents can share one cache
 * per font. Numbers differ from sheet to sheet, so the cache gains about 30 kB a document: it is renewed
 * every 200 documents, which holds a worker drawing a course's sheets to a few MB (at 2,000 it grew
 * by 60 MB a worker) and re-shapes the common words too rarely to show in the time.
 */
const layoutCaches = new Map<string, Record<string, unknown>>();
const RENEW_AFTER_DOCUMENTS = 200;
let documents = 0;

function sharedLayoutCache(name: string): Record<string, unknown> {
  let cache = layoutCaches.get(name);
  if (!cache) {
    cache = Object.create(null) as Record<string, unknown>;
    layoutCaches.set(name, cache);
  }
  return cache;
}

/** Registers the sheet fonts with `doc`, includes the preset glyphs in each, and selects the regular one. */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  if (++documents % RENEW_AFTER_DOCUMENTS === 0) layoutCaches.clear();
  for (const [name, font] of Object.entries(fonts())) {
    // The types only know paths and buffers; pdfkit itself takes any object with `layout`.
    doc.registerFont(name, font as unknown as Buffer);
    doc.font(name);
    // pdfkit's font object (private but stable in the pinned 0.20.2): encoding text includes its
    // glyphs in the subset, with their widths and Unicode mappings, without drawing anything.
    const embedded = (doc as unknown as { _font: EmbeddedFont })._font;
    if (embedded.layoutCache) embedded.layoutCache = sharedLayoutCache(name);
    embedded.encode(PRESET);
  }
  doc.font(FONT.regular);
}
