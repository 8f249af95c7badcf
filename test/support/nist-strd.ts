import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/**
 * Reads a NIST StRD linear-regression dataset (Statistical Reference Datasets, NIST Information
 * Technology Laboratory) from test/reference/nist-strd/, where it is kept byte for byte as NIST
 * publishes it; the folder's README names the source and the files' SHA-256 sums.
 */
export const nistDir = fileURLToPath(new URL('../reference/nist-strd/', import.meta.url));

/** The SHA-256 sums the folder's README lists, one per dataset. */
export function listedSums(): Record<string, string> {
  const readme = readFileSync(`${nistDir}README.md`, 'utf8');
  return Object.fromEntries([...readme.matchAll(/^([0-9a-f]{64}) {2}(\w+)\.dat$/gm)].map((m) => [m[2], m[1]]));
}

export function sha256Of(name: string): string {
  return createHash('sha256').update(readFileSync(`${nistDir}${name}.dat`)).digest('hex');
}

export interface StrdDataset {
  x: number[];
  y: number[];
  certified: {
    params: Record<string, { estimate: number; sd: number }>;
    residualSD: number;
    rSquared: number;
  };
}

const num = (s: string): number => Number(s.replace(/E/i, 'e'));

export function readStrd(name: string): StrdDataset {
  const lines = readFileSync(`${nistDir}${name}.dat`, 'latin1').split(/\r?\n/);
  const range = /Data\s+\(lines (\d+) to (\d+)\)/.exec(lines.join('\n'));
  if (!range) throw new Error(`${name}.dat: no data range in the header`);
  const first = Number(range[1]);
  const last = Number(range[2]);
  const x: number[] = [];
  const y: number[] = [];
  for (let i = first; i <= last; i++) {
    const [yv, xv] = lines[i - 1].trim().split(/\s+/).map(num);
    y.push(yv);
    x.push(xv);
  }
  const params: StrdDataset['certified']['params'] = {};
  let residualSD = NaN;
  let rSquared = NaN;
  for (const line of lines.slice(0, first - 1)) {
    const p = /^\s*(B\d+)\s+(\S+)\s+(\S+)\s*$/.exec(line);
    if (p) params[p[1]] = { estimate: num(p[2]), sd: num(p[3]) };
    const sd = /Standard Deviation\s+(\S+)\s*$/.exec(line);
    if (sd) residualSD = num(sd[1]);
    const r2 = /R-Squared\s+(\S+)\s*$/.exec(line);
    if (r2) rSquared = num(r2[1]);
  }
  return { x, y, certified: { params, residualSD, rSquared } };
}

/** Log relative error: the number of significant digits that agree (capped at 15, a double's worth). */
export function lre(computed: number, certified: number): number {
  if (computed === certified) return 15;
  const rel = certified === 0 ? Math.abs(computed) : Math.abs(computed - certified) / Math.abs(certified);
  return Math.min(15, -Math.log10(rel));
}
