import PDFDocument from 'pdfkit';
import type { Doc } from './doc-type.ts';
import { registerFonts, FONT } from './fonts.ts';
import { richLines } from './rich-lines.ts';
import { drawRich } from './rich-text.ts';
import { COLOR, PAGE, SIZE } from './theme.ts';

export type { Doc } from './doc-type.ts';

export interface DocumentOptions {
  title: string;
  /** For the PDF's dates, so that the same input gives the same file. */
  date: Date;
}

/** An A4 document with the sheet fonts, buffering pages so that footers can count them at the end. */
export function createDocument(options: DocumentOptions): Doc {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: { top: PAGE.margin, left: PAGE.margin, right: PAGE.margin, bottom: PAGE.margin + PAGE.footer },
    bufferPages: true,
    autoFirstPage: true,
    // No default font: pdfkit would parse Helvetica's metrics for every document, and it is never used.
    font: null as unknown as string,
    info: { Title: options.title, Creator: 'Rateproof', Producer: 'Rateproof', CreationDate: options.date, ModDate: options.date },
    lang: 'en',
  });
  registerFonts(doc);
  doc.fillColor(COLOR.ink).fontSize(SIZE.body);
  return doc;
}

/** The bytes of `doc` once ended. Call before `finish`. */
export function collect(doc: Doc): Promise<Buffer> {
  const chunks: Buffer[] = [];
  return new Promise((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}

/**
 * Joins what the current page has drawn since the last call into one piece, the page's bytes
 * unchanged. pdfkit keeps each drawing operator as its own small byte array until the document ends,
 * some 300 bytes apiece: a strip plot of 20,000 students' marks held 120 MB of heap that way. Called
 * every so many marks. Pieces joined before stay as they are: joining the whole page each time copied
 * a page that grows to 23 MB some eighty times, and the copies outran the collector.
 */
export function compactPage(doc: Doc): void {
  const content = (doc.page as unknown as { content?: { buffer?: unknown } }).content;
  const pieces = content?.buffer;
  if (!content || !Array.isArray(pieces)) return;
  const joined = joinedPieces.get(content) ?? 0;
  if (pieces.length - joined < 2) return;
  pieces.splice(joined, pieces.length - joined, Buffer.concat(pieces.slice(joined) as Uint8Array[]));
  joinedPieces.set(content, joined + 1);
}

/** Per page's content, how many of its first pieces are already joined ones. */
const joinedPieces = new WeakMap<object, number>();

export const contentLeft = (doc: Doc): number => doc.page.margins.left;
export const contentWidth = (doc: Doc): number => doc.page.width - doc.page.margins.left - doc.page.margins.right;
export const contentBottom = (doc: Doc): number => doc.page.height - doc.page.margins.bottom;

/** Starts a new page when fewer than `height` points are left; returns the top to draw at. */
export function ensureSpace(doc: Doc, height: number): number {
  if (doc.y + height > contentBottom(doc)) {
    doc.addPage();
  }
  return doc.y;
}

/** Moves the cursor to the left margin at `y`. */
export function moveTo(doc: Doc, y: number): void {
  doc.x = contentLeft(doc);
  doc.y = y;
}

/** A section title (sub/superscript markup allowed) with a short rule under it; keeps `keepWith` points of what follows on the same page. */
export function sectionHeading(doc: Doc, title: string, keepWith = 60): void {
  const top = ensureSpace(doc, 28 + keepWith);
  const y = top + (top > doc.page.margins.top + 1 ? 10 : 0);
  drawRich(doc, title, contentLeft(doc), y, { size: SIZE.heading, bold: true, color: COLOR.ink });
  const ruleY = y + SIZE.heading + 4;
  doc.save().moveTo(contentLeft(doc), ruleY).lineTo(contentLeft(doc) + 36, ruleY).lineWidth(2).strokeColor(COLOR.accent).stroke().restore();
  doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink);
  moveTo(doc, ruleY + 8);
}

/**
 * Wrapped text over the content width (less `indent`), advancing the cursor; sub/superscript markup
 * (`k_{obs}`) prints as in labels. At least three lines stay with what comes before; the rest flows
 * onto the next page line by line.
 */
export function paragraph(doc: Doc, text: string, options: { size?: number; color?: string; bold?: boolean; indent?: number; gap?: number } = {}): void {
  const indent = options.indent ?? 0;
  const size = options.size ?? SIZE.body;
  const bold = options.bold ?? false;
  doc.font(bold ? FONT.bold : FONT.regular).fontSize(size);
  // As pdfkit spaces the lines of its own wrapped text.
  const lineHeight = doc.currentLineHeight(true) + LINE_GAP;
  ensureSpace(doc, 3 * lineHeight);
  for (const line of richLines(doc, text, contentWidth(doc) - indent, size, bold, true)) {
    ensureSpace(doc, lineHeight);
    drawRich(doc, line, contentLeft(doc) + indent, doc.y, { size, bold, color: options.color ?? COLOR.ink });
    doc.y += lineHeight;
  }
  doc.fillColor(COLOR.ink).font(FONT.regular).fontSize(SIZE.body);
  doc.x = contentLeft(doc);
  doc.y += options.gap ?? 4;
}

const LINE_GAP = 1.5;

export interface FooterLines {
  /** What the page is (document, student or section, counts): printed whole. */
  left: string;
  /** The assignment's title after it, cut after a whole word with an ellipsis where the line is too short (the header prints it whole). */
  title: string;
  /** Printed on every page when set: the data are invented, not students' work. */
  invented?: string;
}

/** The space kept between the footer's words and "page i of n". */
const FOOTER_GAP = 12;

/**
 * The footer's one line (the invented-data note takes the next): `left · title`, the title cut after
 * its last whole word that fits with an ellipsis, so no word is cut and `left` is never lost.
 */
export function footerLine(left: string, title: string, widthOf: (text: string) => number, room: number): string {
  const whole = `${left} · ${title}`;
  if (widthOf(whole) <= room) return whole;
  const words = title.split(/\s+/);
  for (let n = words.length - 1; n > 0; n--) {
    const line = `${left} · ${words.slice(0, n).join(' ').replace(/[\s,;:·(–-]+$/, '')}…`;
    if (widthOf(line) <= room) return line;
  }
  return left;
}

/** Writes each page's footer (with "page i of n") and ends the document. */
export function finish(doc: Doc, footer: FooterLines): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    // Text below the bottom margin would start a new page: lift the margin while writing the footer.
    doc.page.margins.bottom = 0;
    const left = contentLeft(doc);
    const width = contentWidth(doc);
    const y = doc.page.height - PAGE.margin - PAGE.footer + 10;
    doc.save().moveTo(left, y - 5).lineTo(left + width, y - 5).lineWidth(0.5).strokeColor(COLOR.rule).stroke().restore();
    doc.font(FONT.regular).fontSize(SIZE.small).fillColor(COLOR.muted);
    const pageText = `page ${i - range.start + 1} of ${range.count}`;
    const room = width - doc.widthOfString(pageText) - FOOTER_GAP;
    doc.text(footerLine(footer.left, footer.title, (text) => doc.widthOfString(text), room), left, y, { lineBreak: false });
    doc.text(pageText, left + width - doc.widthOfString(pageText), y, { lineBreak: false });
    if (footer.invented) {
      doc.font(FONT.bold).fillColor(COLOR.student);
      doc.text(footer.invented, left, y + SIZE.small + 4, { lineBreak: false });
    }
    doc.page.margins.bottom = bottom;
  }
  doc.end();
}
