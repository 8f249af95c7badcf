import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { contentLeft, contentWidth, ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { marker } from '../../../reports/pdf/marks.ts';
import { Plot } from '../../../reports/pdf/plot.ts';
import { drawRich } from '../../../reports/pdf/rich-text.ts';
import { niceAxis } from '../../../reports/pdf/scale.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { runTitle } from './run-plots.ts';
import type { RunSeries } from './run-series.ts';

const HEIGHT = 128;

/** Residuals of ln F (from the readings) about the refit line, for each run with a suspect reading. */
export function drawResidualPlots(doc: Doc, series: Array<RunSeries | undefined>): void {
  const flagged = series.filter((s): s is RunSeries => s !== undefined && s.suspect.length > 0 && s.ours.length > 0);
  if (flagged.length === 0) return;
  sectionHeading(doc, 'Residuals where a reading looks suspect', HEIGHT + 40);
  paragraph(doc, 'ln F from each reading minus the refit line at its time. A reading far from the others’ scatter is marked; it may be a copying slip, or it may be real — please check it against your notebook.', {
    size: SIZE.small,
    color: COLOR.muted,
  });
  for (const s of flagged) {
    const top = ensureSpace(doc, HEIGHT + 16);
    const residuals = s.ours.map((p) => ({ ...p, r: p.y - (s.ourLine.intercept + s.ourLine.slope * p.t) }));
    const tMax = Math.max(...residuals.map((p) => p.t));
    const plot = new Plot(doc, { x: contentLeft(doc), y: top, width: contentWidth(doc), height: HEIGHT }, niceAxis([0, tMax], { includeZero: true, pad: 0 }), niceAxis([0, ...residuals.map((p) => p.r)], { pad: 0.08 }), {
      title: runTitle(s),
      x: `t / ${prettyUnit(s.timeUnit)}`,
      y: 'residual in ln F',
    });
    plot.drawFrame();
    for (const p of residuals) {
      const suspect = s.suspect.includes(p.index);
      doc.save().moveTo(plot.sx(p.t), plot.sy(0)).lineTo(plot.sx(p.t), plot.sy(p.r)).lineWidth(0.6).strokeColor(COLOR.rule).stroke().restore();
      marker(doc, suspect ? 'diamond' : 'disc', plot.sx(p.t), plot.sy(p.r), suspect ? 6 : 3.6, suspect ? COLOR.student : COLOR.ink);
    }
    for (const p of residuals.filter((r) => s.suspect.includes(r.index))) {
      const x = plot.sx(p.t);
      const label = `reading ${p.index + 1}: ${formatNumber(p.r, 3)}`;
      const right = x > plot.area.x + plot.area.width - 90;
      const y = Math.min(Math.max(plot.sy(p.r) - 4, plot.area.y + 2), plot.area.y + plot.area.height - 10);
      drawRich(doc, label, right ? x - 8 : x + 8, y, { size: SIZE.tiny, color: COLOR.student, bold: true, align: right ? 'right' : 'left' });
    }
    moveTo(doc, top + HEIGHT + 10);
  }
}
