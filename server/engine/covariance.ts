import { EngineError } from './engine-error.ts';

/**
 * (J'J)^-1 for a tall Jacobian with a few columns, by Cholesky after scaling each column to unit
 * length: the scaling removes the conditioning that comes only from the parameters' units
 * (a rate constant near 0.05 next to an amplitude near 10).
 */
export function inverseNormalMatrix(columns: ArrayLike<number>[]): number[][] {
  const p = columns.length;
  const n = columns[0].length;
  const scale = columns.map((c) => {
    let s = 0;
    for (let i = 0; i < n; i++) s += c[i] * c[i];
    return Math.sqrt(s);
  });
  // Normal matrix of the scaled columns, lower triangle.
  const a: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += columns[r][i] * columns[c][i];
      a[r][c] = s / (scale[r] * scale[c]);
    }
  }
  // Cholesky a = L L'.
  const l: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let s = a[r][c];
      for (let k = 0; k < c; k++) s -= l[r][k] * l[c][k];
      if (r === c) {
        if (!(s > 1e-14)) throw new EngineError('no-convergence', 'the fitted parameters cannot be told apart by these data', 'readings');
        l[r][r] = Math.sqrt(s);
      } else {
        l[r][c] = s / l[c][c];
      }
    }
  }
  // Inverse of L by forward substitution, then (L L')^-1 = L^-T L^-1.
  const li: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let c = 0; c < p; c++) {
    li[c][c] = 1 / l[c][c];
    for (let r = c + 1; r < p; r++) {
      let s = 0;
      for (let k = c; k < r; k++) s -= l[r][k] * li[k][c];
      li[r][c] = s / l[r][r];
    }
  }
  const inv: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let r = 0; r < p; r++) {
    for (let c = 0; c < p; c++) {
      let s = 0;
      for (let k = Math.max(r, c); k < p; k++) s += li[k][r] * li[k][c];
      inv[r][c] = s / (scale[r] * scale[c]);
    }
  }
  return inv;
}
