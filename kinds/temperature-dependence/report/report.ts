import type { Refit, Settings, Submission } from '../schemas.ts';
import type { KindReport } from '../../../reports/kind-report.ts';
import { rubricLinesOf } from '../../../reports/feedback/rubric-lines.ts';
import { drawArrheniusPlot } from './arrhenius-plot.ts';
import { classActivation } from './class-activation.ts';
import { temperatureDependenceDescription } from './description.ts';
import { temperatureDependenceDisplay } from './display.ts';
import { SYMBOLS } from './symbols.ts';
import { VALUE_COLUMNS, valueRows } from './value-rows.ts';
import { paragraph, sectionHeading } from '../../../reports/pdf/document.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';

const RUBRIC_LABELS: Record<keyof Settings['rubric'], string> = {
  k: 'k of each run',
  ...SYMBOLS,
  EaUncertainty: `Standard error of ${SYMBOLS.Ea}`,
  sigFigs: 'Significant figures',
};

const WEIGHTS: Record<(typeof VALUE_COLUMNS)[number], number> = { Quantity: 0.8, Reported: 2, Refit: 2, Difference: 0.9, Tolerance: 1.2 };

/** Whether a submission has the points a place in it may name (a refused one may not). */
function hasPoints(submission: unknown): submission is Pick<Submission, 'points'> {
  return typeof submission === 'object' && submission !== null && 'points' in submission && Array.isArray(submission.points);
}

function describe(path: string, submission: Pick<Submission, 'points'> | undefined): string {
  const top = /^reported\.(Ea|A|dH|dS)(\.uncertainty|\.unit)?$/.exec(path);
  if (top) {
    const symbol = SYMBOLS[top[1] as keyof typeof SYMBOLS];
    return top[2] === '.uncertainty' ? `standard error of ${symbol}` : top[2] === '.unit' ? `unit of ${symbol}` : symbol;
  }
  const point = /^points\[(\d+)\](?:\.(.*))?$/.exec(path);
  if (!point) return path;
  const label = submission?.points?.[Number(point[1])]?.label;
  const where = label === undefined ? `Point ${Number(point[1]) + 1}` : `Point “${label}”`;
  const PLACES: Record<string, string> = { 'run.reported.k': 'k of the run', 'run.readings': 'readings of the run', 'run.infinity': 'end value of the run', 'k.unit': 'unit of k', 'k.value': 'k' };
  return point[2] ? `${where}, ${PLACES[point[2]] ?? point[2]}` : where;
}

/**
 * The documents' parts for `temperature-dependence`: reported against refit values and the Arrhenius
 * plot on the sheet; the class's activation energies in the summary.
 */
export const temperatureDependenceReport: KindReport<Settings, Submission, Refit> = {
  description: temperatureDependenceDescription,
  describePath: (path, submission) => describe(path, hasPoints(submission) ? submission : undefined),
  rubricBreakdown: (_settings, _submission, result) => rubricLinesOf(result, RUBRIC_LABELS),
  drawSheetData(doc, input) {
    const { settings, submission } = input;
    const refit = input.result.refit;
    if (!refit) return;
    sectionHeading(doc, 'Reported and refitted', 80);
    paragraph(doc, 'The refit is our own straight-line fit of your rate constants against 1/T (temperatures in kelvin, k per second for Eyring), with its standard error.', { size: SIZE.small, color: COLOR.muted });
    const rows = valueRows(settings, submission, refit);
    drawTable(doc, VALUE_COLUMNS.map((header) => ({ header, weight: WEIGHTS[header], align: header === 'Difference' ? ('right' as const) : undefined })), rows, { zebra: true, keepRows: rows.length });
    drawArrheniusPlot(doc, refit, submission.reported);
  },
  display: temperatureDependenceDisplay,
  summaryFacts: (settings) => [['Fit', settings.fit === 'weighted' ? 'weighted by SE(ln k)' : 'ordinary least squares']],
  summaryPart: classActivation,
};
