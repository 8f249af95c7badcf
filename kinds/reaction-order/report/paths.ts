import type { Submission } from '../schemas.ts';
import { prettyUnit, withMinusSign } from '../../../reports/format.ts';

/**
 * A finding's place in words, with sub/superscript markup: `runs[1].reported.halfLife` → Run “B”,
 * half-life t_{1/2}. Places it does not know are printed as they are.
 */
const TOP: Record<string, string> = {
  runs: 'All runs',
  'reported.order': 'order n',
  'reported.k': 'k',
  'reported.k.value': 'k',
  'reported.k.uncertainty': 'standard error of k',
  'reported.k.unit': 'unit of k',
};

const IN_RUN: Record<string, string> = {
  readings: 'readings',
  timeUnit: 'time unit',
  initialConcentration: '[A]_{0}',
  'initialConcentration.value': '[A]_{0}',
  'initialConcentration.unit': 'unit of [A]_{0}',
  'reported.halfLife': 'half-life t_{1/2}',
  'reported.halfLife.value': 'half-life t_{1/2}',
  'reported.halfLife.uncertainty': 'standard error of t_{1/2}',
  'reported.halfLife.unit': 'unit of t_{1/2}',
};

/** Whether a submission has the runs a place may name (a refused one may not). */
export function hasRuns(submission: unknown): submission is Pick<Submission, 'runs'> {
  return typeof submission === 'object' && submission !== null && 'runs' in submission && Array.isArray(submission.runs);
}

export function describePath(path: string, submission: Pick<Submission, 'runs'> | undefined): string {
  if (TOP[path]) return TOP[path];
  const run = /^runs\[(\d+)\](?:\.(.*))?$/.exec(path);
  if (!run) return path;
  const index = Number(run[1]);
  const data = submission?.runs[index];
  const where = data?.label === undefined ? `Run ${index + 1}` : `Run “${data.label}”`;
  const rest = run[2] ?? '';
  const reading = /^readings\[(\d+)\](?:\[\d+\])?$/.exec(rest);
  if (reading) {
    const row = Number(reading[1]);
    const t = data?.readings[row]?.[0];
    return t === undefined ? `${where}, reading ${row + 1}` : `${where}, reading ${row + 1} (t = ${withMinusSign(String(t))} ${prettyUnit(data!.timeUnit)})`;
  }
  return rest === '' ? where : `${where}, ${IN_RUN[rest] ?? rest}`;
}
