import { contentBottom, contentLeft, contentWidth, type Doc } from './document.ts';
import { FONT } from './fonts.ts';
import { drawRich, isRich } from './rich-text.ts';
import { COLOR, SIZE } from './theme.ts';

/**
 * A simple ruled table: a header row (repeated after a page break), wrapped cells, optional zebra
 * shading and bold rows. Cells with sub/superscript markup (`k_{obs}`) are drawn on one line.
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

  // A cell on one line (most are) is measured and drawn without pdfkit's line wrapper, which is slow.
  const oneLine = (text: string, i: number, bold: boolean): boolean => {
    if (text.includes('\n')) return false;
    doc.font(bold ? FONT.bold : FONT.regular).fontSize(size);
    return doc.widthOfString(text) <= widths[i] - 2 * PAD_X;
  };
  const cellHeight = (text: string, i: number, bold: boolean): number => {
    if (isRich(text) || oneLine(text, i, bold)) return size + 2;
    doc.font(bold ? FONT.bold : FONT.regular).fontSize(size);
    return doc.heightOfString(text || ' ', { width: widths[i] - 2 * PAD_X, lineGap: 1 });
  };
  const rowHeight = (cells: string[], bold: boolean) => Math.max(...cells.map((c, i) => cellHeight(c, i, bold))) + 2 * PAD_Y;

  const drawCells = (cells: string[], y: number, height: number, bold: boolean, color: string) => {
    cells.forEach((text, i) => {
      const column = columns[i];
      const width = widths[i] - 2 * PAD_X;
      if (isRich(text) || oneLine(text, i, bold)) {
        const anchor = column.align === 'right' ? starts[i] + widths[i] - PAD_X : column.align === 'center' ? starts[i] + widths[i] / 2 : starts[i] + PAD_X;
        drawRich(doc, text, anchor, y + PAD_Y, { size, color, bold, align: column.align ?? 'left' });
      } else {
        doc.font(bold ? FONT.bold : FONT.regular).fontSize(size).fillColor(color);
        doc.text(text, starts[i] + PAD_X, y + PAD_Y, { width, align: column.align ?? 'left', lineGap: 1, height: height });
      }
    });
  };

  const header = () => {
    const headers = columns.map((c) => c.header);
    const height = rowHeight(headers, true);
    const y = doc.y;
    doc.save().rect(left, y, tableWidth, height).fill(COLOR.panel).restore();
    drawCells(headers, y, height, true, COLOR.ink);
    doc.save().moveTo(left, y + height).lineTo(left + tableWidth, y + height).lineWidth(0.8).strokeColor(COLOR.muted).stroke().restore();
    doc.y = y + height;
  };

  const keep = (options.keepRows ?? 2) * (size + 2 * PAD_Y + 2) + rowHeight(columns.map((c) => c.header), true);
  if (doc.y + keep > contentBottom(doc)) doc.addPage();
  header();
  rows.forEach((cells, index) => {
    const bold = options.boldRows?.has(index) ?? false;
    const height = rowHeight(cells, bold);
    if (doc.y + height > contentBottom(doc)) {
      doc.addPage();
      header();
    }
    const y = doc.y;
    if (options.zebra && index % 2 === 1) doc.save().rect(left, y, tableWidth, height).fill('#f8f9fb').restore();
    drawCells(cells, y, height, bold, COLOR.ink);
    doc.save().moveTo(left, y + height).lineTo(left + tableWidth, y + height).lineWidth(0.3).strokeColor(COLOR.rule).stroke().restore();
    doc.y = y + height;
  });
  doc.x = left;
  doc.y += 6;
  doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink);
}
