import { keepingEverything, type KindReport } from '../../../reports/kind-report.ts';
import type { DisplayPlot, DisplayTable } from '../../../schemas/display.ts';
import { displayAxis } from '../../../reports/display/plot-axes.ts';
import { settingsForm } from '../../../reports/display/settings-form.ts';
import { rubricLinesOf } from '../../../reports/feedback/rubric-lines.ts';
import { OUR_LINE, THEIR_LINE } from '../../../reports/feedback/plot-lines.ts';
import { formatEstimate, formatNumber, formatPercent, prettyUnit, relativeDifference } from '../../../reports/format.ts';
import { contentLeft, contentWidth, moveTo, paragraph, sectionHeading } from '../../../reports/pdf/document.ts';
import { legend, marker } from '../../../reports/pdf/marks.ts';
import { Plot } from '../../../reports/pdf/plot.ts';
import { niceAxis } from '../../../reports/pdf/scale.ts';
import { drawTable } from '../../../reports/pdf/table.ts';
import { COLOR, SIZE } from '../../../reports/pdf/theme.ts';
import { findingWords } from '../../../reports/labels.ts';
import { DECAY_RUNS, findingCodes, Settings, type Refit, type Submission } from './schemas.ts';
import { lnFPoints, timeLabel } from './series.ts';

const NOTE = 'The refit is our straight line through ln F = ln[(x − x_{∞})/(x_{0} − x_{∞})] against t for each run, with its standard error; your line is drawn with your k through our intercept.';
const COLUMNS = ['Run', 'Reported k', 'Refit k', 'Difference'];

/** Each run's row: its label, the reported and refit k, and how far apart they are. */
function valueRows(submission: Submission, refit: Refit): string[][] {
  return submission.runs.map((run, i) => {
    const ours = refit.runs[i]?.k;
    const reported = run.reported.k.value;
    return [run.label, formatNumber(reported), ours ? `${formatEstimate(ours.value, ours.standardError)} ${prettyUnit(ours.unit)}` : 'not refitted', ours ? formatPercent(relativeDifference(reported, ours.value)) : '—'];
  });
}

function describe(path: string, submission: unknown): string {
  const match = /^runs\[(\d+)\](?:\.(.*))?$/.exec(path);
  if (!match) return path === 'runs' ? 'the runs' : path;
  const label = (submission as Partial<Submission> | undefined)?.runs?.[Number(match[1])]?.label;
  const where = label === undefined ? `Run ${Number(match[1]) + 1}` : `Run “${label}”`;
  const PLACES: Record<string, string> = { 'reported.k': 'k', 'reported.k.value': 'k', readings: 'readings', infinity: 'end value x_{∞}' };
  return match[2] ? `${where}: ${PLACES[match[2]] ?? match[2]}` : where;
}

/** The ln F plot as the page draws it: a group a run, its points, our line and the student's. */
function lnFPlot(submission: Submission, refit: Refit): DisplayPlot {
  const points = submission.runs.map(lnFPoints);
  const plot: Pick<DisplayPlot, 'x' | 'y'> = { x: displayAxis(timeLabel(submission), points.flat().map((p) => p[0]), { pad: 0 }), y: displayAxis('ln F', points.flat().map((p) => p[1]), { pad: 0.08 }) };
  return {
    title: 'ln F against t, run by run',
    ...plot,
    groups: submission.runs.map((r) => r.label),
    series: submission.runs.flatMap((run, i) => {
      const ours = refit.runs[i];
      if (!ours?.k || ours.interceptLnF === null) return [{ group: i, owner: 'refit' as const, points: points[i] }];
      return [
        { group: i, owner: 'refit' as const, points: points[i] },
        { group: i, owner: 'refit' as const, line: { intercept: ours.interceptLnF, slope: -ours.k.value } },
        { group: i, owner: 'student' as const, line: { intercept: ours.interceptLnF, slope: -run.reported.k.value } },
      ];
    }),
    legend: [
      { label: 'ln F of each reading', mark: 'disc' },
      { label: 'refit line', mark: 'line' },
      { label: 'line of your k', mark: 'dash' },
    ],
    notes: submission.runs.map((run, i) => `Run “${run.label}”: refit slope ${formatNumber(-(refit.runs[i]?.k?.value ?? NaN))}, yours ${formatNumber(-run.reported.k.value)}`),
  };
}

/** The sheet's plot: every run's points, our lines and the student's, in one frame. */
function drawLnFPlot(doc: Parameters<KindReport['drawSheetData']>[0], submission: Submission, refit: Refit): void {
  const shown = lnFPlot(submission, refit);
  sectionHeading(doc, shown.title, 230);
  const top = doc.y;
  const legendHeight = legend(doc, [
    { kind: 'marker', shape: 'disc', color: COLOR.accent, label: 'ln F of each reading' },
    { kind: 'line', style: OUR_LINE, label: 'refit line' },
    { kind: 'line', style: THEIR_LINE, label: 'line of your k' },
  ], contentLeft(doc), top, contentWidth(doc));
  const all = submission.runs.flatMap(lnFPoints);
  const box = { x: contentLeft(doc), y: top + legendHeight + 4, width: contentWidth(doc) * 0.7, height: 190 };
  const plot = new Plot(doc, box, niceAxis(all.map((p) => p[0]), { pad: 0 }), niceAxis(all.map((p) => p[1]), { pad: 0.08 }), { x: timeLabel(submission), y: 'ln F' });
  plot.drawFrame();
  for (const series of shown.series) {
    if (series.line) plot.line(series.line.intercept, series.line.slope, series.owner === 'refit' ? OUR_LINE : THEIR_LINE);
    for (const [x, y] of series.points ?? []) marker(doc, 'disc', plot.sx(x), plot.sy(y), 4, COLOR.accent);
  }
  moveTo(doc, box.y + box.height + 6);
  for (const note of shown.notes) paragraph(doc, note, { size: SIZE.tiny, color: COLOR.muted });
}

/** The documents' and the page's parts of the test kind. */
export const decayRunsReport: KindReport<Settings, Submission, Refit> = {
  description: {
    kind: DECAY_RUNS,
    title: 'Decay runs, k of each (test kind)',
    quantities: [{ id: 'k', label: 'rate constant of a run', symbol: 'k', unit: 'min^-1' }],
    settings: {
      form: settingsForm(Settings, {
        groups: [{ label: 'Grading', keys: ['tolerance', 'pointsPerRun', 'minReadings'] }],
        kept: [],
        words: { tolerance: 'Tolerance on k (a share)', pointsPerRun: 'Points for k of each run', minReadings: 'Readings a run should have' },
      }),
    },
    upload: { json: true, csv: [{ name: 'readings', required: true, columns: ['student_id', 'run', 'time_unit', 'infinity', 't', 'x', 'reported_k'], optionalColumns: [] }] },
    findings: findingWords(findingCodes, { 'half-life-for-k': 'Half-life given for k' }),
    signals: { unit: 'run', reportedValue: 'reported k', codes: [{ code: 'few-readings', label: 'A run with fewer readings than asked' }] },
  },
  describePath: describe,
  rubricBreakdown: (_settings, _submission, result) => rubricLinesOf(result, { k: 'k of each run' }),
  drawSheetData(doc, { submission, result }) {
    if (!result.refit) return;
    sectionHeading(doc, 'Each run: reported and refitted k', 80);
    paragraph(doc, NOTE, { size: SIZE.small, color: COLOR.muted });
    const rows = valueRows(submission, result.refit);
    drawTable(doc, COLUMNS.map((header, i) => ({ header, weight: i === 2 ? 2 : 1, align: i === 0 ? ('left' as const) : ('right' as const) })), rows, { zebra: true, keepRows: rows.length });
    drawLnFPlot(doc, submission, result.refit);
  },
  display({ submission, result }) {
    if (!result.refit) return { comparison: null, plots: [] };
    const comparison: DisplayTable = { caption: 'Each run: reported and refitted k', note: NOTE, columns: COLUMNS.map((header, i) => ({ header, numeric: i > 0 })), rows: valueRows(submission, result.refit) };
    return { comparison, plots: [lnFPlot(submission, result.refit)] };
  },
  summaryFacts: (settings) => [['Tolerance on k', `${Math.round(settings.tolerance * 1000) / 10} %`], ['Readings a run should have', String(settings.minReadings)]],
  // A test kind's sections are small: its part keeps every result.
  summaryPart: (settings) => keepingEverything(settings, (doc, { results }) => {
    const byLabel = new Map<string, number[]>();
    for (const r of results) for (const run of r.refit?.runs ?? []) if (run.k) byLabel.set(run.label, [...(byLabel.get(run.label) ?? []), run.k.value]);
    sectionHeading(doc, 'The class’s k, run by run', 60);
    const rows = [...byLabel].map(([label, ks]) => {
      const sorted = [...ks].sort((a, b) => a - b);
      const median = sorted.length % 2 ? sorted[(sorted.length - 1) / 2] : (sorted[sorted.length / 2 - 1] + sorted[sorted.length / 2]) / 2;
      return [label, String(ks.length), formatNumber(median), `${formatNumber(sorted[0])} to ${formatNumber(sorted.at(-1)!)}`];
    });
    drawTable(doc, ['Run', 'Refitted', 'Median refit k', 'Range'].map((header) => ({ header, weight: 1 })), rows, { zebra: true });
  }),
};
