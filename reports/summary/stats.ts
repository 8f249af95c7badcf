/** Mean, sample standard deviation (n − 1), median and range of a list of numbers. */
export interface Spread {
  n: number;
  mean: number;
  sd: number;
  median: number;
  min: number;
  max: number;
}

export function spread(values: readonly number[]): Spread | undefined {
  const finite = values.filter(Number.isFinite);
  const n = finite.length;
  if (n === 0) return undefined;
  const mean = finite.reduce((a, b) => a + b, 0) / n;
  const sd = n > 1 ? Math.sqrt(finite.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1)) : NaN;
  const sorted = [...finite].sort((a, b) => a - b);
  const median = n % 2 === 1 ? sorted[(n - 1) / 2] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
  return { n, mean, sd, median, min: sorted[0], max: sorted[n - 1] };
}

/** Counts of `fractions` (0..1) in ten bins of 10 %, the last closed: [0, 10), ..., [90, 100]. */
export function percentBins(fractions: readonly number[]): number[] {
  const bins = Array.from({ length: 10 }, () => 0);
  for (const f of fractions) bins[Math.min(9, Math.max(0, Math.floor(f * 10 + 1e-9)))] += 1;
  return bins;
}
