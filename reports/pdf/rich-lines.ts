import type { Doc } from './doc-type.ts';
import { richWidth } from './rich-text.ts';

/**
 * Line breaking for text with sub/superscript markup, shared by paragraphs and table cells: a line
 * breaks only at a space that is not part of a quantity (`1.9 × 10⁻⁷ min⁻¹`, `0.03 ± 0.002`; a no-break
 * space never breaks) nor inside markup (`_{…}`).
 */

/**
 * A space that joins: the parts of one number (either side of ± or ×), a number and the word after it
 * (`87.2 kJ`), a unit power and what stands before it (`kJ mol⁻¹`), or a space inside markup.
 */
const JOINED = /(?<=[±×]) | (?=[±×])|(?<=\d) (?=[A-Za-zµ°])| (?=\S*[⁻⁰¹²³⁴⁵⁶⁷⁸⁹])| (?=[^{]*\})/g;

/** The pieces a line may break between. */
export function unbreakablePieces(line: string): string[] {
  return line
    .replace(JOINED, '\u0000')
    .split(' ')
    .filter((p) => p !== '')
    .map((p) => p.replace(/\u0000/g, ' '));
}

/**
 * `text` broken into lines no wider than `width`, each of its own lines kept. With `cutLong`, a piece
 * wider than a whole line (a long name, a URL) is cut between characters, as pdfkit would; without,
 * it stands alone on its line (a table sets such a cell smaller instead).
 */
export function richLines(doc: Doc, text: string, width: number, size: number, bold = false, cutLong = false): string[] {
  const lines: string[] = [];
  for (const written of text.split('\n')) {
    let line = '';
    for (const piece of unbreakablePieces(written).flatMap((p) => (cutLong ? cut(doc, p, width, size, bold) : [p]))) {
      const next = line === '' ? piece : `${line} ${piece}`;
      if (line !== '' && richWidth(doc, next, size, bold) > width) {
        lines.push(line);
        line = piece;
      } else line = next;
    }
    lines.push(line);
  }
  return lines;
}

function cut(doc: Doc, piece: string, width: number, size: number, bold: boolean): string[] {
  if (piece.includes('{') || richWidth(doc, piece, size, bold) <= width) return [piece];
  const parts: string[] = [];
  let part = '';
  for (const c of piece) {
    if (part !== '' && richWidth(doc, part + c, size, bold) > width) {
      parts.push(part);
      part = '';
    }
    part += c;
  }
  return [...parts, part];
}
