import type { Submission } from '../schemas.ts';
import { prettyUnit, withMinusSign } from '../../../reports/format.ts';

/**
 * A finding's path in words, with sub/superscript markup: `runs[2].reported.k` → Run “0.20 M”: k_{obs}.
 * Paths it does not know are printed as they are.
 */
const QUANTITIES: Record<string, string> = {
  'reported.lnF': 'ln F column',
  'reported.k': 'k_{obs}',
  'reported.k.uncertainty': 'standard error of k_{obs}',
  'reported.k.unit': 'unit of k_{obs}',
  'reported.k.value': 'k_{obs}',
  readings: 'readings',
  infinity: 'end value x_{∞}',
  catalyst: 'catalyst concentration',
  timeUnit: 'time unit',
  'reported.specificRotation': '[α]_{eq}',
  'reported.xB': 'x_{B}',
  'reported.K': 'K',
  'reported.kf': 'k_{f}',
  'reported.kr': 'k_{r}',
};

const TOP: Record<string, string> = {
  runs: 'All runs',
  'reported.kN': 'k_{N}',
  'reported.kN.uncertainty': 'standard error of k_{N}',
  'reported.kN.unit': 'unit of k_{N}',
  'reported.kA': 'k_{A}',
  'reported.kA.uncertainty': 'standard error of k_{A}',
  'reported.kA.unit': 'unit of k_{A}',
  'reported.K': 'mean K',
  'reported.kNf': 'k_{N,f}',
  'reported.kNr': 'k_{N,r}',
  'reported.kAf': 'k_{A,f}',
  'reported.kAr': 'k_{A,r}',
};

export function runLabel(submission: Pick<Submission, 'runs'> | undefined, index: number): string {
  const label = submission?.runs[index]?.label;
  return label === undefined ? `Run ${index + 1}` : `Run “${label}”`;
}

export function describePath(path: string, submission: Pick<Submission, 'runs'> | undefined): string {
  if (TOP[path]) return TOP[path];
  const run = /^runs\[(\d+)\](?:\.(.*))?$/.exec(path);
  if (!run) return path;
  const index = Number(run[1]);
  const rest = run[2] ?? '';
  const where = runLabel(submission, index);
  const reading = /^readings\[(\d+)\](?:\[\d+\])?$/.exec(rest);
  if (reading) {
    const row = Number(reading[1]);
    const data = submission?.runs[index];
    const t = data?.readings[row]?.[0];
    return t === undefined ? `${where}, reading ${row + 1}` : `${where}, reading ${row + 1} (t = ${withMinusSign(String(t))} ${prettyUnit(data!.timeUnit)})`;
  }
  const lnFCell = /^reported\.lnF\[(\d+)\]$/.exec(rest);
  if (lnFCell) return `${where}, ln F cell ${Number(lnFCell[1]) + 1}`;
  return rest === '' ? where : `${where}, ${QUANTITIES[rest] ?? rest}`;
}
