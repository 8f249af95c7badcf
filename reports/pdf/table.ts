import { contentBottom, contentLeft, contentWidth, type Doc } from './document.ts';
import { FONT } from './fonts.ts';
import { richLines, unbreakablePieces } from './rich-lines.ts';
import { drawRich, richWidth } from './rich-text.ts';
import { COLOR, SIZE } from './theme.ts';

/**
 * A simple ruled table: a header row (repeated after a page break), wrapped cells, optional zebra
 * shading and bold rows. Cells may carry sub/superscript markup (`k_{obs}`).
 */
export interface Column {
  header: string;
  /** Share of the table's width. */
  weight: number;
  align?: 'left' | 'right' | 'center';
}

export interface TableOptions {
  size?: number;
  /** Rows (by index) printed in bold, e.g. a total. */
  boldRows?: ReadonlySet<number>;
  zebra?: boolean;
  /** Page room to keep for the first rows; the table starts on a new page otherwise. */
  keepRows?: number;
}

const PAD_X = 4;
const PAD_Y = 3;

export function drawTable(doc: Doc, columns: Column[], rows: string[][], options: TableOptions = {}): void {
  const size = options.size ?? SIZE.small;
  const left = contentLeft(doc);
  const total = columns.reduce((sum, c) => sum + c.weight, 0);
  const widths = columns.map((c) => (c.weight / total) * contentWidth(doc));
  const starts = widths.map((_, i) => left + widths.slice(0, i).reduce((a, b) => a + b, 0));
  const tableWidth = contentWidth(doc);

  // Cells are laid out here, not by pdfkit's wrapper (slow, and blind to numbers): a line breaks only
  // at a space that is not part of a number (`1.9 × 10⁻⁷`, `0.03 ± 0.002`), and a cell whose longest
  // unbreakable piece is wider than its column is set smaller rather than broken inside it.
  const layout = (text: string, i: number, bold: boolean): CellLayout => layoutCell(doc, text, widths[i] - 2 * PAD_X, size, bold);
  // Each row is laid out once: its height and its drawing read the same layouts.
  const layRow = (cells: string[], bold: boolean): CellLayout[] => cells.map((c, i) => layout(c, i, bold));
  const rowHeight = (laid: CellLayout[]) => Math.max(...laid.map((cell) => cell.height)) + 2 * PAD_Y;

  const drawCells = (laid: CellLayout[], y: number, bold: boolean, color: string) => {
    laid.forEach((cell, i) => {
      const column = columns[i];
      const anchor = column.align === 'right' ? starts[i] + widths[i] - PAD_X : column.align === 'center' ? starts[i] + widths[i] / 2 : starts[i] + PAD_X;
      cell.lines.forEach((line, n) => drawRich(doc, line, anchor, y + PAD_Y + n * cell.lineHeight, { size: cell.size, color, bold, align: column.align ?? 'left' }));
    });
  };

  const headerLaid = layRow(columns.map((c) => c.header), true);
  const headerHeight = rowHeight(headerLaid);
  const header = () => {
    const height = headerHeight;
    const y = doc.y;
    doc.save().rect(left, y, tableWidth, height).fill(COLOR.panel).restore();
    drawCells(headerLaid, y, true, COLOR.ink);
    doc.save().moveTo(left, y + height).lineTo(left + tableWidth, y + height).lineWidth(0.8).strokeColor(COLOR.muted).stroke().restore();
    doc.y = y + height;
  };

  const keep = (options.keepRows ?? 2) * (size + 2 * PAD_Y + 2) + headerHeight;
  if (doc.y + keep > contentBottom(doc)) doc.addPage();
  header();
  rows.forEach((cells, index) => {
    const bold = options.boldRows?.has(index) ?? false;
    const laid = layRow(cells, bold);
    const height = rowHeight(laid);
    if (doc.y + height > contentBottom(doc)) {
      doc.addPage();
      header();
    }
    const y = doc.y;
    if (options.zebra && index % 2 === 1) doc.save().rect(left, y, tableWidth, height).fill('#f8f9fb').restore();
    drawCells(laid, y, bold, COLOR.ink);
    doc.save().moveTo(left, y + height).lineTo(left + tableWidth, y + height).lineWidth(0.3).strokeColor(COLOR.rule).stroke().restore();
    doc.y = y + height;
  });
  doc.x = left;
  doc.y += 6;
  doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink);
}

interface CellLayout {
  lines: string[];
  size: number;
  lineHeight: number;
  height: number;
}

const SMALLEST = 0.72;

export function layoutCell(doc: Doc, text: string, width: number, size: number, bold: boolean): CellLayout {
  const widest = Math.max(0, ...text.split('\n').flatMap(unbreakablePieces).map((p) => richWidth(doc, p, size, bold)));
  // Shrunk to fit the widest piece, never below a legible size (a wider piece then runs into the padding).
  const cellSize = widest > width ? Math.max(SMALLEST * size, (size * width) / widest) : size;
  const lines = richLines(doc, text, width, cellSize, bold);
  const lineHeight = cellSize + 2;
  return { lines, size: cellSize, lineHeight, height: lines.length * lineHeight };
}
