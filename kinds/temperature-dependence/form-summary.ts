import { counted, perUnitLine, readingsLine, reportedLines } from '../../server/checks/form-lines.ts';
import type { Point, Submission } from './schemas.ts';

/** A temperature's k: measured, or reported from its run. */
const kOf = (p: Point) => p.k ?? p.run?.reported?.k;

/** What a temperature-dependence submission's form holds: its temperatures, measured k or runs, and E_a, A, ΔH‡, ΔS‡. */
export function temperatureFormSummary(submission: Submission): string[] {
  const points = submission.points;
  const runs = points.flatMap((p) => (p.run ? [p.run] : []));
  const measured = points.length - runs.length;
  const read = `${counted(points.length, 'temperature')} read`;
  const first =
    runs.length === 0
      ? `${read}, each with a measured k`
      : measured === 0
        ? `${read}, each as a run of readings`
        : `${read}: ${counted(measured, 'measured k', 'measured k')} and ${counted(runs.length, 'run')} of readings`;
  const reported = submission.reported ?? {};
  return [
    first,
    ...(runs.length > 0 ? [readingsLine(runs.map((r) => r.readings.length))] : []),
    perUnitLine('k', points.map((p) => kOf(p) !== undefined), 'temperature'),
    ...(points.some((p) => kOf(p)) ? [perUnitLine('the standard error of k', points.map((p) => { const k = kOf(p); return k === undefined ? null : k.uncertainty !== undefined; }), 'temperature', 'given')] : []),
    ...reportedLines([
      { name: 'E_a', value: reported.Ea },
      { name: 'A', value: reported.A },
      { name: 'ΔH‡', value: reported.dH },
      { name: 'ΔS‡', value: reported.dS },
    ]),
  ];
}
