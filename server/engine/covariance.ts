import { EngineError } from './engine-error.ts';

/**
 * (J'J)^-1 for a tall Jacobian of two or three columns (the exponential fit's parameters), row-major.
 * The normal matrix is scaled to unit diagonal before it is inverted by cofactors, which removes the
 * conditioning that comes only from the parameters' units (a rate constant near 0.05 next to an
 * amplitude near 10); a pivot that vanishes means the data cannot tell the parameters apart.
 */
export function inverseNormalMatrix(columns: ArrayLike<number>[]): number[] {
  const p = columns.length;
  if (p !== 2 && p !== 3) throw new RangeError('two or three columns');
  const n = columns[0].length;
  const a = new Array<number>(p * p);
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = 0;
      const cr = columns[r];
      const cc = columns[c];
      for (let i = 0; i < n; i++) s += cr[i] * cc[i];
      a[r * p + c] = s;
      a[c * p + r] = s;
    }
  }
  const d = new Array<number>(p);
  for (let r = 0; r < p; r++) d[r] = Math.sqrt(a[r * p + r]);
  for (let r = 0; r < p; r++) for (let c = 0; c < p; c++) a[r * p + c] /= d[r] * d[c];
  const inv = p === 2 ? inverse2(a) : inverse3(a);
  for (let r = 0; r < p; r++) for (let c = 0; c < p; c++) inv[r * p + c] /= d[r] * d[c];
  return inv;
}

function singular(): never {
  throw new EngineError('no-convergence', 'the fitted parameters cannot be told apart by these data', 'readings');
}

function inverse2(a: number[]): number[] {
  const det = a[0] * a[3] - a[1] * a[2];
  if (!(det > 1e-14)) singular();
  return [a[3] / det, -a[1] / det, -a[2] / det, a[0] / det];
}

function inverse3(m: number[]): number[] {
  const [a, b, c, , e, f, , , i] = m;
  // Symmetric: m[3] = b, m[6] = c, m[7] = f.
  const A = e * i - f * f;
  const B = c * f - b * i;
  const C = b * f - c * e;
  const det = a * A + b * B + c * C;
  if (!(det > 1e-14)) singular();
  const D = a * i - c * c;
  const E = b * c - a * f;
  const F = a * e - b * b;
  return [A / det, B / det, C / det, B / det, D / det, E / det, C / det, E / det, F / det];
}
