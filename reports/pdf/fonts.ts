import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { deflateSync } from 'node:zlib';
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

/** A string shaped as pdfkit's `layout` returns it: glyphs, their positions (already scaled) and the advance. */
interface Layout {
  glyphs: unknown[];
  positions: unknown[];
  advanceWidth: number;
}

interface EmbeddedFont {
  encode(text: string): unknown;
  layout(text: string, features?: unknown, onlyWidth?: boolean): Layout;
  embed(): unknown;
  document: { ref(data?: object): PdfStream };
  layoutCache?: Record<string, unknown>;
}

/** pdfkit's PDFReference, as far as the font file's stream is written here. */
interface PdfStream {
  compress: boolean;
  data: Record<string, unknown>;
  end(chunk?: Uint8Array): void;
}

/**
 * pdfkit shapes a string word by word, each word once per document in the font object's layoutCache,
 * but joins the words' glyph and position arrays again at every call: and a label is measured two or
 * three times before it is drawn (its width for alignment, then pdfkit's own measures while drawing).
 * So whole strings are kept too, in one cache per font shared by documents (the runs are already
 * scaled and only read afterwards; an empty `features` is pdfkit's default shaping). A line being
 * filled is measured at each word it gains: such strings keep only their advance, not their glyphs.
 * Numbers differ from sheet to sheet, so the caches grow with every document (a thread's live heap
 * after 195 sheets: 31 MB without them, 34 MB with them): they are renewed every 200 documents, which
 * holds a worker drawing a course's sheets to a few MB (at 2,000 it grew by 60 MB a worker) and
 * re-shapes the common words too rarely to show in the time.
 */
interface SharedLayouts {
  words: Record<string, unknown>;
  /** Strings drawn: their glyphs and positions. */
  strings: Map<string, Layout>;
  /** Strings only measured (a line being filled word by word is measured at each word): their advance. */
  widths: Map<string, number>;
}

const layoutCaches = new Map<string, SharedLayouts>();
const RENEW_AFTER_DOCUMENTS = 200;
let documents = 0;

function sharedLayouts(name: string): SharedLayouts {
  let cache = layoutCaches.get(name);
  if (!cache) {
    cache = { words: Object.create(null) as Record<string, unknown>, strings: new Map(), widths: new Map() };
    layoutCaches.set(name, cache);
  }
  return cache;
}

function withSharedLayouts(embedded: EmbeddedFont, cache: SharedLayouts): void {
  if (!embedded.layoutCache) return;
  embedded.layoutCache = cache.words;
  const layout = embedded.layout;
  embedded.layout = function (this: EmbeddedFont, text, features, onlyWidth) {
    if (features) return layout.call(this, text, features, onlyWidth);
    let shaped = cache.strings.get(text);
    if (!shaped && onlyWidth) {
      let advanceWidth = cache.widths.get(text);
      if (advanceWidth === undefined) {
        advanceWidth = layout.call(this, text, undefined, true).advanceWidth;
        cache.widths.set(text, advanceWidth);
      }
      return { glyphs: [], positions: [], advanceWidth };
    }
    if (!shaped) {
      shaped = layout.call(this, text);
      cache.strings.set(text, shaped);
    }
    return shaped;
  };
}

/**
 * The subset's bytes are the same for most documents (see withSubsetCache), and so is their
 * compressed stream: deflating the two font files was a tenth of a sheet's time. pdfkit writes the
 * font file as the first stream `embed` makes; here that stream is given the bytes compressed once
 * (by the same zlib call pdfkit makes, so the file is byte for byte the same) and told not to
 * compress them again.
 */
const deflated = new WeakMap<Uint8Array, Uint8Array>();

function withDeflatedFontFile(embedded: EmbeddedFont): void {
  const embed = embedded.embed;
  embedded.embed = function (this: EmbeddedFont) {
    const document = this.document;
    const ref = document.ref;
    document.ref = function (data?: object) {
      document.ref = ref;
      const fontFile = ref.call(this, data);
      const end = fontFile.end;
      fontFile.end = (bytes?: Uint8Array) => {
        if (!bytes || !fontFile.compress) return end.call(fontFile, bytes);
        let packed = deflated.get(bytes);
        if (!packed) {
          packed = deflateSync(bytes);
          deflated.set(bytes, packed);
        }
        fontFile.compress = false;
        // In the order pdfkit's own write puts them, Length first, so the dictionary reads the same.
        fontFile.data.Length ??= 0;
        fontFile.data.Filter = 'FlateDecode';
        return end.call(fontFile, packed);
      };
      return fontFile;
    };
    try {
      return embed.call(this);
    } finally {
      document.ref = ref;
    }
  };
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
    withSharedLayouts(embedded, sharedLayouts(name));
    withDeflatedFontFile(embedded);
    embedded.encode(PRESET);
  }
  doc.font(FONT.regular);
}
