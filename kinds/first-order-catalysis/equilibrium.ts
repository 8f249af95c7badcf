import type { Estimate } from '../../server/engine/estimate.ts';
import { SPECIFIC_ROTATION_UNIT, type MassConcentration, type PathLength } from './schemas.ts';

/**
 * The last step of a polarimetric run: its end value as the equilibrium composition of A ⇌ B, and
 * its k_obs split into the forward and reverse rate constants.
 *
 *   [α]_eq = α_inf / (l c)   (l in dm, c in g/mL)
 *   x_B = ([α]_A − [α]_eq) / ([α]_A − [α]_B),   K = [B]/[A] = x_B / (1 − x_B)
 *   k_obs = k_f + k_r with K = k_f / k_r, so k_f = k_obs x_B and k_r = k_obs (1 − x_B)
 *
 * Standard errors by first-order propagation (the derivative of each formula times the SE of its
 * input, added in quadrature where there are two). The pure forms' rotations, l and c are taken as
 * exact; k_obs and α_inf are taken as independent, though k_obs is fitted with that α_inf: their
 * covariance is left out, which is the usual textbook treatment (common practice, no source).
 */

// 1 dm = 10 cm = 100 mm; 1 g/mL = 100 g/100 mL = 1000 g/L: definitions of the units.
const DM_PER: Record<PathLength['unit'], number> = { dm: 1, cm: 0.1, mm: 0.01 };
const G_PER_ML_PER: Record<MassConcentration['unit'], number> = { 'g/mL': 1, 'g/100 mL': 0.01, 'g/L': 0.001 };

export const inDm = (l: PathLength): number => l.value * DM_PER[l.unit];
export const inGramsPerMl = (c: MassConcentration): number => c.value * G_PER_ML_PER[c.unit];

// 1.96: the two-sided 95 % normal quantile; a propagated SE carries no degrees of freedom.
const Z95 = 1.96;

export function estimate(value: number, standardError: number, unit: string): Estimate {
  return { value, standardError, ci95: [value - Z95 * standardError, value + Z95 * standardError], unit };
}

export interface PureForms {
  /** Specific rotation of A, the anomer with the larger one, and of B. */
  a: number;
  b: number;
}

export interface Composition {
  specificRotation: Estimate;
  xB: Estimate;
  /** Absent where x_B lies outside 0 to 1 (exclusive): no K follows from it. */
  K?: Estimate;
}

/** x_B from a specific rotation between the pure forms' (outside them it is outside 0 to 1). */
export const fractionB = (specificRotation: number, pure: PureForms): number => (pure.a - specificRotation) / (pure.a - pure.b);

/** K = x_B / (1 − x_B). */
export const constantOf = (xB: number): number => xB / (1 - xB);

/** x_B = K / (1 + K), the inverse of constantOf. */
export const fractionOf = (K: number): number => K / (1 + K);

/** The composition at equilibrium from α_inf (in deg) and its standard error, in a cell of `lDm` with `cGPerMl`. */
export function compositionOf(alphaInf: number, alphaSE: number, lDm: number, cGPerMl: number, pure: PureForms): Composition {
  const span = pure.a - pure.b;
  const rotation = alphaInf / (lDm * cGPerMl);
  const rotationSE = alphaSE / (lDm * cGPerMl);
  const x = fractionB(rotation, pure);
  const xSE = rotationSE / span;
  const composition: Composition = { specificRotation: estimate(rotation, rotationSE, SPECIFIC_ROTATION_UNIT), xB: estimate(x, xSE, '1') };
  // dK/dx_B = 1 / (1 − x_B)^2.
  if (x > 0 && x < 1) composition.K = estimate(constantOf(x), xSE / (1 - x) ** 2, '1');
  return composition;
}

/** k_f = k x_B and k_r = k (1 − x_B), in k's unit, with SEs from k's and x_B's. */
export function splitRate(k: Estimate, xB: Estimate): { kf: Estimate; kr: Estimate } {
  const x = xB.value;
  const kSE = k.standardError;
  const fromX = k.value * xB.standardError;
  return {
    kf: estimate(k.value * x, Math.hypot(x * kSE, fromX), k.unit),
    kr: estimate(k.value * (1 - x), Math.hypot((1 - x) * kSE, fromX), k.unit),
  };
}

/**
 * The mean K of the runs, its standard error and the runs' spread: with two runs or more the SE is
 * the sample SD over √n (the runs' scatter, which holds errors of making up and of reading alike);
 * with one, that run's propagated SE.
 */
export function meanConstant(Ks: Estimate[]): { value: number; standardError: number; sd?: number; n: number } | undefined {
  const n = Ks.length;
  if (n === 0) return undefined;
  const mean = Ks.reduce((s, k) => s + k.value, 0) / n;
  if (n === 1) return { value: mean, standardError: Ks[0].standardError, n };
  const sd = Math.sqrt(Ks.reduce((s, k) => s + (k.value - mean) ** 2, 0) / (n - 1));
  return { value: mean, standardError: sd / Math.sqrt(n), sd, n };
}

/** x_B from K with its SE: dx_B/dK = 1 / (1 + K)^2. */
export function fractionFromConstant(K: { value: number; standardError: number }): Estimate {
  return estimate(fractionOf(K.value), K.standardError / (1 + K.value) ** 2, '1');
}
