import { formatNumber } from '../format.ts';
import type { Column } from '../pdf/table.ts';
import { spread } from './stats.ts';

/** The columns of a spread of class values (n, mean, SD, median, range), for a summary's tables. */
export const SPREAD_COLUMNS: Column[] = [
  { header: 'n', weight: 0.4, align: 'right' },
  { header: 'Mean', weight: 1, align: 'right' },
  { header: 'SD', weight: 0.9, align: 'right' },
  { header: 'Median', weight: 1, align: 'right' },
  { header: 'Range', weight: 1.8 },
];

/** The cells under SPREAD_COLUMNS for these values: n 0 and dashes when there are none. */
export function spreadCells(values: readonly number[]): string[] {
  const s = spread(values);
  if (!s) return ['0', '—', '—', '—', '—'];
  return [String(s.n), formatNumber(s.mean), Number.isFinite(s.sd) ? formatNumber(s.sd, 2) : '—', formatNumber(s.median), `${formatNumber(s.min, 3)} to ${formatNumber(s.max, 3)}`];
}
