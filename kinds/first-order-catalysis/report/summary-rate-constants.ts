import type { Settings } from '../schemas.ts';
import { formatNumber, prettyUnit } from '../../../reports/format.ts';
import { ensureSpace, moveTo, paragraph, sectionHeading, type Doc } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { SIZE, COLOR } from '../../../reports/pdf/theme.ts';
import type { ClassValues } from './class-values.ts';
import { SPREAD_COLUMNS, spreadCells } from '../../../reports/summary/spread-table.ts';
import { drawStripPlot } from './strip-plot.ts';

const SYMBOL = { kN: 'k_{N}', kA: 'k_{A}', K: 'K' } as const;

export function spreadRow(values: ClassValues, source: string, data: number[]): string[] {
  const outside = values.band ? data.filter((v) => v < values.band!.min || v > values.band!.max).length : undefined;
  return [
    SYMBOL[values.quantity],
    source,
    ...spreadCells(data),
    values.band ? `${formatNumber(values.band.min, 3)} to ${formatNumber(values.band.max, 3)}` : 'none',
    outside === undefined ? '—' : String(outside),
  ];
}

/** The class's k_N and k_A, refitted and as reported (`submissions`: whether they were given), against the reference band. */
export function drawRateConstants(doc: Doc, settings: Settings, values: ClassValues[], submissions: boolean): void {
  if (values.every((v) => v.refit.length === 0 && v.reported.length === 0)) return;
  sectionHeading(doc, 'The class’s k_{N} and k_{A}', 150);
  paragraph(
    doc,
    `Refit: our fit of each student’s own readings. Reported: the values the students handed in` +
      (submissions ? '' : ' (not given for this summary)') +
      `, converted to the assignment’s units. SD is the sample standard deviation. Units: ${prettyUnit(settings.units.kN)} for the first-order constant, ${prettyUnit(settings.units.kA)} for the catalytic one.`,
    { size: SIZE.small, color: COLOR.muted },
  );
  const rows = values.flatMap((v) => [spreadRow(v, 'refit', v.refit), ...(submissions ? [spreadRow(v, 'reported', v.reported)] : [])]);
  drawTable(
    doc,
    [
      { header: '', weight: 0.5 },
      { header: 'Source', weight: 0.9 },
      ...SPREAD_COLUMNS,
      { header: 'Reference band', weight: 1.6 },
      { header: 'Outside band', weight: 1.1, align: 'right' },
    ],
    rows,
    { zebra: true, keepRows: rows.length },
  );
  const unreadable = values.reduce((n, v) => n + v.unreadable, 0);
  if (unreadable > 0) paragraph(doc, `${unreadable} reported value(s) left out: their unit could not be read.`, { size: SIZE.small, color: COLOR.muted });
  for (const v of values) {
    if (v.refit.length + v.reported.length === 0) continue;
    ensureSpace(doc, 130);
    moveTo(doc, doc.y + 6);
    drawStripPlot(doc, v);
  }
}
