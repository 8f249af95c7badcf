import type { Refit } from '../../schemas/kinds/temperature-dependence.ts';
import { GAS_CONSTANT } from '../../server/engine/physical-constants.ts';
import { convert } from '../../server/engine/units.ts';
import { formatNumber, prettyUnit } from '../format.ts';
import { contentLeft, contentWidth, moveTo, sectionHeading, type Doc } from '../pdf/document.ts';
import { legend, marker } from '../pdf/marks.ts';
import { Plot } from '../pdf/plot.ts';
import { niceAxis } from '../pdf/scale.ts';
import { COLOR } from '../pdf/theme.ts';
import { OUR_LINE } from '../feedback/run-plots.ts';

const HEIGHT = 200;

/** ln(k / s^-1) against 1000 K / T: the points and the refitted line ln k = ln A - E_a/(R T). */
export function drawArrheniusPlot(doc: Doc, refit: Refit): void {
  sectionHeading(doc, 'Arrhenius plot: ln k against 1/T', HEIGHT + 30);
  const top = doc.y;
  const xs = refit.points.map((p) => 1000 / p.temperatureK);
  const ys = refit.points.map((p) => Math.log(p.kPerSecond));
  const Ea = convert(refit.Ea.value, refit.Ea.unit, 'J mol^-1');
  const lnA = Math.log(convert(refit.A.value, refit.A.unit, 's^-1'));
  // With x = 1000 K / T the slope is -E_a / (1000 R).
  const slope = -Ea / (1000 * GAS_CONSTANT);
  const plot = new Plot(doc, { x: contentLeft(doc), y: top, width: contentWidth(doc), height: HEIGHT }, niceAxis(xs, { pad: 0.05 }), niceAxis(ys, { pad: 0.08 }), {
    x: '1000 K / T',
    y: 'ln(k / s^{−1})',
  });
  plot.drawFrame();
  plot.clipped(() => plot.line(lnA, slope, OUR_LINE));
  xs.forEach((x, i) => marker(doc, 'disc', plot.sx(x), plot.sy(ys[i]), 4.5, COLOR.accent));
  moveTo(doc, top + HEIGHT + 4);
  const height = legend(
    doc,
    [
      { kind: 'marker', shape: 'disc', color: COLOR.accent, label: 'your k at each temperature' },
      { kind: 'line', style: OUR_LINE, label: `refit: E_{a} = ${formatNumber(refit.Ea.value)} ${prettyUnit(refit.Ea.unit)}, ln(A / s^{−1}) = ${formatNumber(lnA)}` },
    ],
    contentLeft(doc),
    doc.y,
    contentWidth(doc),
  );
  moveTo(doc, doc.y + height + 6);
}
