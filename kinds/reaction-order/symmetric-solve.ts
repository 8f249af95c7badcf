import { EngineError } from '../../server/engine/engine-error.ts';

/**
 * The inverse of a symmetric positive-definite matrix (row-major, p x p) by Cholesky factorisation,
 * scaled to unit diagonal first so that parameters of different units (k beside concentrations) do
 * not make it look ill-conditioned. The nonlinear fit of every run at once has one parameter per run
 * and k, more than the generic two- and three-parameter inverse takes.
 */
export function inverseSymmetric(a: readonly number[], p: number): number[] {
  const d = Array.from({ length: p }, (_, r) => Math.sqrt(a[r * p + r]));
  if (d.some((v) => !(v > 0))) singular();
  const s = a.map((v, i) => v / (d[Math.floor(i / p)] * d[i % p]));
  // Cholesky: s = L L'.
  const l = new Array<number>(p * p).fill(0);
  for (let r = 0; r < p; r++) {
    for (let c = 0; c <= r; c++) {
      let sum = s[r * p + c];
      for (let j = 0; j < c; j++) sum -= l[r * p + j] * l[c * p + j];
      if (r === c) {
        if (!(sum > 1e-13)) singular();
        l[r * p + r] = Math.sqrt(sum);
      } else {
        l[r * p + c] = sum / l[c * p + c];
      }
    }
  }
  // inv(s) column by column: solve L y = e, then L' x = y.
  const inv = new Array<number>(p * p).fill(0);
  for (let col = 0; col < p; col++) {
    const y = new Array<number>(p).fill(0);
    for (let r = 0; r < p; r++) {
      let sum = r === col ? 1 : 0;
      for (let j = 0; j < r; j++) sum -= l[r * p + j] * y[j];
      y[r] = sum / l[r * p + r];
    }
    for (let r = p - 1; r >= 0; r--) {
      let sum = y[r];
      for (let j = r + 1; j < p; j++) sum -= l[j * p + r] * inv[j * p + col];
      inv[r * p + col] = sum / l[r * p + r];
    }
  }
  return inv.map((v, i) => v / (d[Math.floor(i / p)] * d[i % p]));
}

function singular(): never {
  throw new EngineError('no-convergence', 'the fitted parameters cannot be told apart by these data', 'readings');
}
