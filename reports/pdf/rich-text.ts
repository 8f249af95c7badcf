import type { Doc } from './doc-type.ts';
import { FONT } from './fonts.ts';

/**
 * One-line labels with real sub- and superscripts: `k_{obs}`, `α_{∞}`, `x^{2}`. Unicode superscripts
 * (⁻¹) need no markup; subscript letters mostly have no Unicode form, hence the markup.
 */

type Shift = 'base' | 'sub' | 'sup';
interface Segment {
  text: string;
  shift: Shift;
}

const SCRIPT_SCALE = 0.7;
// DejaVu Sans's ascent is 0.928 em; pdfkit places a line's top, not its baseline, at y.
const ASCENT = 0.928;

export function parseRich(text: string): Segment[] {
  const segments: Segment[] = [];
  const pattern = /([_^])\{([^}]*)\}/g;
  let last = 0;
  for (const match of text.matchAll(pattern)) {
    if (match.index > last) segments.push({ text: text.slice(last, match.index), shift: 'base' });
    segments.push({ text: match[2], shift: match[1] === '_' ? 'sub' : 'sup' });
    last = match.index + match[0].length;
  }
  if (last < text.length) segments.push({ text: text.slice(last), shift: 'base' });
  return segments;
}

/** The text without markup, as a reader (or pdftotext) sees it. */
export function plainRich(text: string): string {
  return parseRich(text).map((s) => s.text).join('');
}

export interface RichOptions {
  size: number;
  color?: string;
  bold?: boolean;
  align?: 'left' | 'center' | 'right';
}

const sizeOf = (segment: Segment, size: number) => (segment.shift === 'base' ? size : size * SCRIPT_SCALE);

export function richWidth(doc: Doc, text: string, size: number, bold = false): number {
  doc.font(bold ? FONT.bold : FONT.regular);
  return parseRich(text).reduce((width, s) => width + doc.fontSize(sizeOf(s, size)).widthOfString(s.text), 0);
}

/**
 * Draws `text` with its top at `y`; `x` is its left, centre or right end by `align`. Returns the width.
 * The text cursor (doc.x, doc.y) is left where it was: labels never push the flow of the page.
 */
export function drawRich(doc: Doc, text: string, x: number, y: number, options: RichOptions): number {
  const { size } = options;
  const saved = { x: doc.x, y: doc.y };
  const width = richWidth(doc, text, size, options.bold);
  let cursor = options.align === 'center' ? x - width / 2 : options.align === 'right' ? x - width : x;
  doc.font(options.bold ? FONT.bold : FONT.regular);
  if (options.color) doc.fillColor(options.color);
  const baseline = y + ASCENT * size;
  for (const segment of parseRich(text)) {
    const segmentSize = sizeOf(segment, size);
    const shift = segment.shift === 'sub' ? 0.22 * size : segment.shift === 'sup' ? -0.36 * size : 0;
    doc.fontSize(segmentSize);
    doc.text(segment.text, cursor, baseline + shift - ASCENT * segmentSize, { lineBreak: false });
    cursor += doc.widthOfString(segment.text);
  }
  doc.fontSize(size);
  doc.x = saved.x;
  doc.y = saved.y;
  return width;
}
