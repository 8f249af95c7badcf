import { EngineError } from './engine-error.ts';

/**
 * (J'J)^-1 for a tall Jacobian with a few columns, by Cholesky after scaling each column to unit
 * length: the scaling removes the conditioning that comes only from the parameters' units
 * (a rate constant near 0.05 next to an amplitude near 10). Matrices are flat, row-major, p x p.
 */
export function inverseNormalMatrix(columns: ArrayLike<number>[]): number[] {
  const p = columns.length;
  const n = columns[0].length;
  const scale = new Array<number>(p);
  const a = new Array<number>(p * p).fill(0);
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += columns[r][i] * columns[c][i];
      a[r * p + c] = s;
    }
    scale[r] = Math.sqrt(a[r * p + r]);
  }
  // Cholesky of the scaled matrix, a = L L', L stored in the lower triangle of `a`.
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = a[r * p + c] / (scale[r] * scale[c]);
      for (let k = 0; k < c; k++) s -= a[r * p + k] * a[c * p + k];
      if (r === c) {
        if (!(s > 1e-14)) throw new EngineError('no-convergence', 'the fitted parameters cannot be told apart by these data', 'readings');
        a[r * p + r] = Math.sqrt(s);
      } else {
        a[r * p + c] = s / a[c * p + c];
      }
    }
  }
  // L^-1 by forward substitution, then (L L')^-1 = L^-T L^-1, unscaled.
  const li = new Array<number>(p * p).fill(0);
  for (let c = 0; c < p; c++) {
    li[c * p + c] = 1 / a[c * p + c];
    for (let r = c + 1; r < p; r++) {
      let s = 0;
      for (let k = c; k < r; k++) s -= a[r * p + k] * li[k * p + c];
      li[r * p + c] = s / a[r * p + r];
    }
  }
  const inv = new Array<number>(p * p);
  for (let r = 0; r < p; r++) {
    for (let c = 0; c < p; c++) {
      let s = 0;
      for (let k = Math.max(r, c); k < p; k++) s += li[k * p + r] * li[k * p + c];
      inv[r * p + c] = s / (scale[r] * scale[c]);
    }
  }
  return inv;
}
