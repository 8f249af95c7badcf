import type { Doc } from './document.ts';
import { FONT } from './fonts.ts';
import { drawRich } from './rich-text.ts';
import { axisLabel, tickLabel, type Axis } from './scale.ts';
import { COLOR, SIZE } from './theme.ts';

/** A rectangle on the page, in points from the top left. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface PlotLabels {
  title?: string;
  x: string;
  y: string;
}

/** Room around the data area for the title, tick labels and axis labels. */
const INSET = { top: 16, right: 8, bottom: 28, left: 50 };

/**
 * A 2-D plot: the data area inside `outer`, linear scales, grid, ticks and labels. Drawing methods take
 * data coordinates; `clipped` keeps lines inside the frame.
 */
export class Plot {
  readonly area: Box;

  constructor(
    private readonly doc: Doc,
    readonly outer: Box,
    readonly xAxis: Axis,
    readonly yAxis: Axis,
    private readonly labels: PlotLabels,
  ) {
    const top = labels.title ? INSET.top : 6;
    this.area = {
      x: outer.x + INSET.left,
      y: outer.y + top,
      width: outer.width - INSET.left - INSET.right,
      height: outer.height - top - INSET.bottom,
    };
  }

  sx(value: number): number {
    const { min, max } = this.xAxis;
    return this.area.x + ((value - min) / (max - min)) * this.area.width;
  }

  sy(value: number): number {
    const { min, max } = this.yAxis;
    return this.area.y + this.area.height - ((value - min) / (max - min)) * this.area.height;
  }

  inside(x: number, y: number): boolean {
    return x >= this.xAxis.min && x <= this.xAxis.max && y >= this.yAxis.min && y <= this.yAxis.max;
  }

  /** Whether the line y = intercept + slope x passes through the data area at all. */
  crosses(intercept: number, slope: number): boolean {
    const ends = [intercept + slope * this.xAxis.min, intercept + slope * this.xAxis.max];
    return Math.max(...ends) >= this.yAxis.min && Math.min(...ends) <= this.yAxis.max;
  }

  /** Frame, grid, ticks, tick labels, axis labels and title. */
  drawFrame(): void {
    const { doc, area } = this;
    const cursor = { x: doc.x, y: doc.y };
    doc.save();
    doc.rect(area.x, area.y, area.width, area.height).fill('#ffffff');
    doc.lineWidth(0.4).strokeColor(COLOR.grid);
    for (const t of this.xAxis.ticks) doc.moveTo(this.sx(t), area.y).lineTo(this.sx(t), area.y + area.height).stroke();
    for (const t of this.yAxis.ticks) doc.moveTo(area.x, this.sy(t)).lineTo(area.x + area.width, this.sy(t)).stroke();
    if (this.yAxis.min < 0 && this.yAxis.max > 0) {
      doc.lineWidth(0.6).strokeColor(COLOR.rule).moveTo(area.x, this.sy(0)).lineTo(area.x + area.width, this.sy(0)).stroke();
    }
    doc.lineWidth(0.7).strokeColor(COLOR.muted).rect(area.x, area.y, area.width, area.height).stroke();
    doc.font(FONT.regular).fontSize(SIZE.tiny).fillColor(COLOR.muted);
    for (const t of this.xAxis.ticks) {
      const x = this.sx(t);
      doc.moveTo(x, area.y + area.height).lineTo(x, area.y + area.height + 3).stroke();
      const text = tickLabel(this.xAxis, t);
      doc.text(text, x - doc.widthOfString(text) / 2, area.y + area.height + 4, { lineBreak: false });
    }
    for (const t of this.yAxis.ticks) {
      const y = this.sy(t);
      doc.moveTo(area.x - 3, y).lineTo(area.x, y).stroke();
      const text = tickLabel(this.yAxis, t);
      doc.text(text, area.x - 5 - doc.widthOfString(text), y - SIZE.tiny * 0.6, { lineBreak: false });
    }
    drawRich(doc, axisLabel(this.labels.x, this.xAxis), area.x + area.width / 2, area.y + area.height + 14, { size: SIZE.small, color: COLOR.ink, align: 'center' });
    // The y label, turned a quarter to read upwards, centred on the data area.
    const yLabelX = this.outer.x + 2;
    const centreY = area.y + area.height / 2;
    doc.save();
    doc.rotate(-90, { origin: [yLabelX, centreY] });
    drawRich(doc, axisLabel(this.labels.y, this.yAxis), yLabelX, centreY, { size: SIZE.small, color: COLOR.ink, align: 'center' });
    doc.restore();
    if (this.labels.title) {
      drawRich(doc, this.labels.title, area.x, this.outer.y + 1, { size: SIZE.subheading - 1, color: COLOR.ink, bold: true });
    }
    doc.restore();
    doc.font(FONT.regular).fillColor(COLOR.ink);
    doc.x = cursor.x;
    doc.y = cursor.y;
  }

  /** Runs `draw` with the data area as the clipping path. */
  clipped(draw: () => void): void {
    const { doc, area } = this;
    doc.save();
    doc.rect(area.x, area.y, area.width, area.height).clip();
    draw();
    doc.restore();
  }

  /**
   * The straight line y = intercept + slope x, cut to the part inside the frame in data units first: a
   * line far off the axes (a k a million times too large) would otherwise need coordinates no PDF holds.
   */
  line(intercept: number, slope: number, style: LineStyle): void {
    let [from, to] = [this.xAxis.min, this.xAxis.max];
    if (slope !== 0) {
      const atMin = (this.yAxis.min - intercept) / slope;
      const atMax = (this.yAxis.max - intercept) / slope;
      from = Math.max(from, Math.min(atMin, atMax));
      to = Math.min(to, Math.max(atMin, atMax));
    } else if (!(intercept >= this.yAxis.min && intercept <= this.yAxis.max)) return;
    if (!(from <= to)) return;
    this.clipped(() => strokeLine(this.doc, this.sx(from), this.sy(intercept + slope * from), this.sx(to), this.sy(intercept + slope * to), style));
  }
}

export interface LineStyle {
  color: string;
  width?: number;
  dash?: [number, number];
}

export function strokeLine(doc: Doc, x1: number, y1: number, x2: number, y2: number, style: LineStyle): void {
  doc.save();
  doc.lineWidth(style.width ?? 1.1).strokeColor(style.color);
  if (style.dash) doc.dash(style.dash[0], { space: style.dash[1] });
  doc.moveTo(x1, y1).lineTo(x2, y2).stroke();
  doc.restore();
}
