/**
 * ln Γ(x) for x > 0: Stirling's series past 15, reached from below by Γ(x + 1) = x Γ(x). With four
 * correction terms (from the Bernoulli numbers: 1/12, -1/360, 1/1260, -1/1680, from memory) the first
 * term left out is below 1/(1188 · 15^9), about 2e-14 (test/engine/log-gamma.test.ts checks the result
 * against a reference library). Used to bound a beta tail without loading the incomplete beta function.
 */
const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);
const STIRLING_FROM = 15;

export function logGamma(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`logGamma needs a finite x > 0, got ${x}`);
  let shift = 0;
  let z = x;
  // ln(x (x + 1) ... (z - 1)), accumulated as a product and logged in pieces so that it cannot overflow.
  let product = 1;
  while (z < STIRLING_FROM) {
    product *= z;
    z += 1;
    if (product > 1e250) {
      shift += Math.log(product);
      product = 1;
    }
  }
  shift += Math.log(product);
  const inverse = 1 / z;
  const inverse2 = inverse * inverse;
  const series = inverse * (1 / 12 - inverse2 * (1 / 360 - inverse2 * (1 / 1260 - inverse2 / 1680)));
  return (z - 0.5) * Math.log(z) - z + HALF_LOG_TWO_PI + series - shift;
}

/** ln B(a, b) = ln Γ(a) + ln Γ(b) - ln Γ(a + b). */
export function logBeta(a: number, b: number): number {
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}
