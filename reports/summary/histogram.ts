import { contentLeft, contentWidth, moveTo, type Doc } from '../pdf/document.ts';
import { Plot } from '../pdf/plot.ts';
import { niceStep, type Axis } from '../pdf/scale.ts';
import { drawRich } from '../pdf/rich-text.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';

const HEIGHT = 170;

/** An axis of whole counts from 0. */
function countAxis(max: number): Axis {
  const step = Math.max(1, Math.ceil(niceStep(Math.max(max, 1), 5)));
  const top = Math.max(step, Math.ceil(max / step) * step);
  const ticks: number[] = [];
  for (let v = 0; v <= top; v += step) ticks.push(v);
  return { min: 0, max: top, ticks, power: 0, decimals: 0 };
}

/** Students per 10 % band of the score, each bar labelled with its count. */
export function drawScoreHistogram(doc: Doc, bins: number[]): void {
  const xAxis: Axis = { min: 0, max: 100, ticks: bins.map((_, i) => i * 10).concat(100), power: 0, decimals: 0 };
  const plot = new Plot(doc, { x: contentLeft(doc), y: doc.y, width: contentWidth(doc), height: HEIGHT }, xAxis, countAxis(Math.max(...bins)), {
    x: 'score / % of the points (bands of 10 %, the last includes 100 %)',
    y: 'students',
  });
  plot.drawFrame();
  bins.forEach((count, i) => {
    if (count === 0) return;
    const x0 = plot.sx(i * 10) + 2;
    const x1 = plot.sx(i * 10 + 10) - 2;
    const y = plot.sy(count);
    doc.save().rect(x0, y, x1 - x0, plot.sy(0) - y).fillAndStroke(COLOR.accentLight, COLOR.accent).restore();
    drawRich(doc, String(count), (x0 + x1) / 2, y - 10, { size: SIZE.tiny, color: COLOR.ink, align: 'center' });
  });
  moveTo(doc, doc.y + HEIGHT + 8);
}
