import { prettyUnit } from '../../../reports/format.ts';
import { compactPage, contentLeft, contentWidth, moveTo, type Doc } from '../../../reports/pdf/document.ts';
import { legend, markerStamp } from '../../../reports/pdf/marks.ts';
import { Plot } from '../../../reports/pdf/plot.ts';
import { drawRich } from '../../../reports/pdf/rich-text.ts';
import { niceAxis, type Axis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import type { ClassValues } from './class-values.ts';

const HEIGHT = 92;
const MARKS_PER_PIECE = 1000;
const SYMBOL = { kN: 'k_{N}', kA: 'k_{A}', K: 'K' } as const;

/** Every student's value as a dot (refit row and reported row), the reference band shaded behind. */
export function drawStripPlot(doc: Doc, values: ClassValues): void {
  const core = [...values.refit, ...(values.band ? [values.band.min, values.band.max] : [])];
  const base = core.length > 0 ? core : values.reported;
  if (base.length === 0) return;
  // A few values off by a factor of 60 or 1000 would squeeze the class into one pixel: the range is
  // the refit values and the band, widened by what lies near them; the rest is counted at the edges.
  const low = Math.min(...base);
  const high = Math.max(...base);
  const span = high - low || Math.abs(high) || 1;
  const near = (v: number) => v >= low - span && v <= high + span;
  const shown = [...base, ...values.reported.filter(near)];
  const rows = [
    { label: 'refit', data: values.refit, shape: 'disc' as const, color: COLOR.accent },
    { label: 'reported', data: values.reported, shape: 'diamond' as const, color: COLOR.student },
  ];
  const yAxis: Axis = { min: 0, max: 2, ticks: [], power: 0, decimals: 0 };
  const top = doc.y;
  const plot = new Plot(doc, { x: contentLeft(doc), y: top, width: contentWidth(doc), height: HEIGHT }, niceAxis(shown, { pad: 0.05, ticks: 7 }), yAxis, {
    title: `${SYMBOL[values.quantity]}, one mark per ${values.per ?? 'student'}`,
    x: values.unit ? `${SYMBOL[values.quantity]} / ${prettyUnit(values.unit)}` : SYMBOL[values.quantity],
    y: '',
  });
  plot.drawFrame();
  if (values.band) {
    const band = values.band;
    plot.clipped(() => {
      const x0 = plot.sx(band.min);
      const x1 = plot.sx(band.max);
      doc.save().rect(x0, plot.area.y, x1 - x0, plot.area.height).fill(COLOR.band).restore();
      for (const x of [x0, x1]) doc.save().moveTo(x, plot.area.y).lineTo(x, plot.area.y + plot.area.height).lineWidth(0.8).dash(2, { space: 2 }).strokeColor(COLOR.bandEdge).stroke().restore();
    });
  }
  rows.forEach((row, r) => {
    const centre = plot.sy(1.5 - r);
    drawRich(doc, row.label, plot.area.x - 5, centre - 4, { size: SIZE.tiny, color: COLOR.muted, align: 'right' });
    const mark = markerStamp(doc, row.shape, 4, row.color);
    plot.clipped(() => {
      row.data.forEach((v, i) => {
        // A fixed spread within the row (golden-ratio steps), so that equal values stay visible.
        const jitter = (((i * 0.618034) % 1) - 0.5) * 0.6;
        if (plot.inside(v, 1)) mark(plot.sx(v), plot.sy(1.5 - r + jitter));
        // A course's marks would otherwise be held as some ten small pieces each.
        if (i % MARKS_PER_PIECE === MARKS_PER_PIECE - 1) compactPage(doc);
      });
    });
  });
  const offScale = rows
    .map((row) => ({ row, below: row.data.filter((v) => v < plot.xAxis.min).length, above: row.data.filter((v) => v > plot.xAxis.max).length }))
    .filter((o) => o.below + o.above > 0)
    .map((o) => `${o.row.label}: ${[o.below > 0 ? `${o.below} below` : '', o.above > 0 ? `${o.above} above` : ''].filter(Boolean).join(', ')}`);
  moveTo(doc, top + HEIGHT + 2);
  const items = [
    { kind: 'marker', shape: 'disc', color: COLOR.accent, label: 'refit from the student’s data' } as const,
    { kind: 'marker', shape: 'diamond', color: COLOR.student, label: 'as reported' } as const,
    ...(values.band ? [{ kind: 'band', color: COLOR.band, edge: COLOR.bandEdge, label: 'reference band' } as const] : []),
  ];
  moveTo(doc, doc.y + legend(doc, [...items], contentLeft(doc) + 50, doc.y, contentWidth(doc) - 50) + 2);
  if (offScale.length > 0) {
    drawRich(doc, `Beyond the plotted range — ${offScale.join('; ')} (in the table above).`, contentLeft(doc) + 50, doc.y, { size: SIZE.tiny, color: COLOR.muted });
    moveTo(doc, doc.y + 11);
  }
  moveTo(doc, doc.y + 4);
}
