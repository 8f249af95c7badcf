import { slipBetween } from './digit-slips.ts';
import { decimalsOf } from '../engine/decimal-places.ts';

/**
 * Cell-by-cell comparison of a student's copy of a data table with the table handed out: which cells
 * differ and by what slip, or which row was shifted, dropped or added.
 */
export type Row = readonly [number, number];

export type TableSlip =
  | { kind: 'cell'; row: number; column: 0 | 1; original: number; copy: number; detail: string }
  | { kind: 'row-shift' | 'missing-row' | 'extra-row'; row: number; detail: 'row-shift' | 'missing-row' | 'extra-row' }
  | { kind: 'table'; detail: 'other' };

const same = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
const sameRow = (a: Row, b: Row) => same(a[0], b[0]) && same(a[1], b[1]);

/** Decimal places the column is written to: the most any of its values shows. */
function columnDecimals(rows: readonly Row[], column: 0 | 1): number {
  return rows.reduce((d, r) => Math.max(d, decimalsOf(r[column])), 0);
}

/** The index whose removal from `longer` leaves `shorter`, comparing with `eq`. */
function removedIndex<T>(longer: readonly T[], shorter: readonly T[], eq: (a: T, b: T) => boolean): number | undefined {
  let i = 0;
  while (i < shorter.length && eq(longer[i], shorter[i])) i++;
  for (let j = i; j < shorter.length; j++) if (!eq(longer[j + 1], shorter[j])) return undefined;
  return i;
}

function cellSlips(original: readonly Row[], copy: readonly Row[]): TableSlip[] {
  const slips: TableSlip[] = [];
  const decimals = [columnDecimals(original, 0), columnDecimals(original, 1)] as const;
  for (let r = 0; r < original.length; r++) {
    for (const c of [0, 1] as const) {
      if (same(original[r][c], copy[r][c])) continue;
      const detail = slipBetween(original[r][c], copy[r][c], decimals[c]) ?? 'other';
      slips.push({ kind: 'cell', row: r, column: c, original: original[r][c], copy: copy[r][c], detail });
    }
  }
  return slips;
}

/** x values moved one row against their times from some row on (the times themselves kept). */
function shiftedFrom(original: readonly Row[], copy: readonly Row[]): number | undefined {
  const n = Math.min(original.length, copy.length);
  for (let r = 0; r < n; r++) if (!same(original[r][0], copy[r][0])) return undefined;
  const xs = original.map((row) => row[1]);
  const ys = copy.map((row) => row[1]);
  const lost = xs.length >= ys.length ? removedIndex(xs, ys.slice(0, xs.length - 1), same) : removedIndex(ys, xs.slice(0, ys.length - 1), same);
  return lost;
}

export function compareTables(original: readonly Row[], copy: readonly Row[]): TableSlip[] {
  if (copy.length === original.length) {
    const slips = cellSlips(original, copy);
    // Three or more x cells off in a row from one point on, each equal to its neighbour: a shifted column.
    if (slips.length >= 3) {
      const first = slips[0].kind === 'cell' ? slips[0].row : 0;
      const down = copy.slice(first, -1).every((row, k) => same(row[1], original[first + k + 1][1]));
      const up = copy.slice(first + 1).every((row, k) => same(row[1], original[first + k][1]));
      const timesKept = copy.every((row, r) => same(row[0], original[r][0]));
      if (timesKept && (down || up)) return [{ kind: 'row-shift', row: first, detail: 'row-shift' }];
    }
    return slips;
  }
  if (copy.length === original.length - 1) {
    const missing = removedIndex(original, copy, sameRow);
    if (missing !== undefined) return [{ kind: 'missing-row', row: missing, detail: 'missing-row' }];
  }
  if (copy.length === original.length + 1) {
    const extra = removedIndex(copy, original, sameRow);
    if (extra !== undefined) return [{ kind: 'extra-row', row: extra, detail: 'extra-row' }];
  }
  if (Math.abs(copy.length - original.length) === 1) {
    const from = shiftedFrom(original, copy);
    if (from !== undefined) return [{ kind: 'row-shift', row: from, detail: 'row-shift' }];
  }
  return [{ kind: 'table', detail: 'other' }];
}
