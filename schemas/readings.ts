import { z } from 'zod';
import { FiniteNumber, withFastPath } from './common.ts';

const Reading = z.tuple([FiniteNumber, FiniteNumber]);

const MAX_READINGS = 1000;
const ReadingRows = z.array(Reading).min(3, 'at least 3 readings').max(MAX_READINGS).superRefine(timesInOrder);

/** Rows of two finite numbers, times rising or a row repeated exactly: what ReadingRows takes unchanged. */
function plainRows(value: unknown): boolean {
  if (!Array.isArray(value) || value.length < 3 || value.length > MAX_READINGS) return false;
  let tBefore = -Infinity;
  let xBefore = Number.NaN;
  for (let i = 0; i < value.length; i++) {
    const row: unknown = value[i];
    if (!Array.isArray(row) || row.length !== 2) return false;
    const t: unknown = row[0];
    const x: unknown = row[1];
    if (typeof t !== 'number' || typeof x !== 'number' || !Number.isFinite(t) || !Number.isFinite(x)) return false;
    if (t < tBefore || (t === tBefore && x !== xBefore)) return false;
    tBefore = t;
    xBefore = x;
  }
  return true;
}

/** [t, x] pairs in time order; every kind with runs of readings reads them the same way. */
export const Readings = withFastPath(ReadingRows, plainRows);

function timesInOrder(rows: Array<[number, number]>, ctx: z.RefinementCtx): void {
  for (let i = 1; i < rows.length; i++) {
    const [t, x] = rows[i];
    const [tBefore, xBefore] = rows[i - 1];
    if (t < tBefore) ctx.addIssue({ code: 'custom', path: [i, 0], message: `time ${t} comes before the time above it, ${tBefore}` });
    else if (t === tBefore && x !== xBefore) ctx.addIssue({ code: 'custom', path: [i, 0], message: `time ${t} is repeated with a different reading` });
  }
}
