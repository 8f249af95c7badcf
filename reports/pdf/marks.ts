import type { Doc } from './document.ts';
import { FONT } from './fonts.ts';
import { strokeLine, type LineStyle } from './plot.ts';
import { drawRich, richWidth } from './rich-text.ts';
import { COLOR, SIZE } from './theme.ts';

/** Point markers, error bars and legends. Each series differs in shape as well as colour. */
export type MarkerShape = 'disc' | 'ring' | 'diamond' | 'square' | 'triangle';

export function marker(doc: Doc, shape: MarkerShape, x: number, y: number, size: number, color: string): void {
  doc.save().lineWidth(0.9);
  const r = size / 2;
  switch (shape) {
    case 'disc':
      doc.circle(x, y, r).fill(color);
      break;
    case 'ring':
      doc.circle(x, y, r).fillAndStroke('#ffffff', color);
      break;
    case 'diamond':
      doc.polygon([x, y - r * 1.25], [x + r * 1.25, y], [x, y + r * 1.25], [x - r * 1.25, y]).fillAndStroke('#ffffff', color);
      break;
    case 'square':
      doc.rect(x - r, y - r, size, size).fill(color);
      break;
    case 'triangle':
      doc.polygon([x, y - r * 1.2], [x + r * 1.15, y + r * 0.85], [x - r * 1.15, y + r * 0.85]).fill(color);
      break;
  }
  doc.restore();
}

/**
 * A marker drawn once into a form that each mark then places, for plots of thousands of marks: a mark
 * costs some 40 bytes of the page's content instead of 400, and looks the same (the summary's strip
 * plots of a course of 20,000 place over 100,000, which held 23 MB of content until the page ended).
 * The form belongs to the page it was made on: place its marks there.
 */
export function markerStamp(doc: Doc, shape: MarkerShape, size: number, color: string): (x: number, y: number) => void {
  // The stroke reaches past the shape's own extent (a diamond's points lie 1.25 radii out): room on every side.
  const form = doc.ref({ Type: 'XObject', Subtype: 'Form', FormType: 1, BBox: [-size, -size, size, size], Resources: {} });
  // pdfkit draws into the current page's content: pointed at the form for the one marker.
  const page = doc.page as unknown as { content: unknown; xobjects: Record<string, unknown> };
  const content = page.content;
  page.content = form;
  try {
    marker(doc, shape, 0, 0, size, color);
  } finally {
    page.content = content;
  }
  form.end(undefined);
  const name = `Mk${form.id}`;
  page.xobjects[name] = form;
  return (x, y) => {
    doc.save().translate(x, y);
    doc.addContent(`/${name} Do`);
    doc.restore();
  };
}

/** A vertical error bar with caps, from `yLow` to `yHigh` (page coordinates). */
export function errorBar(doc: Doc, x: number, yLow: number, yHigh: number, color: string, cap = 2.5): void {
  doc.save().lineWidth(0.8).strokeColor(color);
  doc.moveTo(x, yLow).lineTo(x, yHigh).stroke();
  doc.moveTo(x - cap, yLow).lineTo(x + cap, yLow).stroke();
  doc.moveTo(x - cap, yHigh).lineTo(x + cap, yHigh).stroke();
  doc.restore();
}

export type LegendItem =
  | { kind: 'marker'; shape: MarkerShape; color: string; label: string; bar?: boolean }
  | { kind: 'line'; style: LineStyle; label: string }
  | { kind: 'band'; color: string; edge: string; label: string };

/** Legend entries laid out left to right, wrapping within `width`. Returns the height used. */
export function legend(doc: Doc, items: LegendItem[], x: number, y: number, width: number, size: number = SIZE.tiny): number {
  const swatch = 16;
  const rowHeight = size + 5;
  let cx = x;
  let cy = y;
  for (const item of items) {
    const itemWidth = swatch + 4 + richWidth(doc, item.label, size) + 12;
    if (cx > x && cx + itemWidth > x + width) {
      cx = x;
      cy += rowHeight;
    }
    const mid = cy + size * 0.55;
    if (item.kind === 'marker') {
      if (item.bar) strokeLine(doc, cx + swatch / 2, mid - 4, cx + swatch / 2, mid + 4, { color: item.color, width: 0.8 });
      marker(doc, item.shape, cx + swatch / 2, mid, 4.2, item.color);
    } else if (item.kind === 'line') {
      strokeLine(doc, cx, mid, cx + swatch, mid, item.style);
    } else {
      doc.save().rect(cx, mid - 3.5, swatch, 7).fillAndStroke(item.color, item.edge).restore();
    }
    drawRich(doc, item.label, cx + swatch + 4, cy, { size, color: COLOR.ink });
    cx += itemWidth;
  }
  doc.font(FONT.regular).fontSize(SIZE.body).fillColor(COLOR.ink);
  return cy + rowHeight - y;
}
