import { EngineError } from '../../server/engine/engine-error.ts';
import type { Estimate } from '../../server/engine/estimate.ts';
import { fitLine, type LineFit } from '../../server/engine/linear-fit.ts';
import { GAS_CONSTANT, LN_KB_OVER_H } from '../../server/engine/physical-constants.ts';
import { lineThroughTwoPoints } from '../../server/engine/two-point-line.ts';

/**
 * Rate constants at several temperatures. Arrhenius: ln k = ln A - Ea/(R T), so ln k against 1/T has
 * slope -Ea/R and intercept ln A. Eyring: ln(k/T) = ln(k_B/h) + dS/R - dH/(R T) with k in s^-1, so
 * ln(k/T) against 1/T has slope -dH/R and intercept ln(k_B/h) + dS/R. Energies come out in J mol^-1,
 * dS in J K^-1 mol^-1, A in the unit of k. Standard errors propagate linearly from the line's; A's
 * interval is exp of the intercept's (exact for a monotonic map). With two points the line passes
 * through both exactly: the values are exact, and their standard errors and intervals are NaN (not
 * defined: no scatter is left to estimate them from).
 */
export interface TemperaturePoint {
  /** In kelvin. */
  temperature: number;
  /** The rate constant; per second for the Eyring fit. */
  k: number;
  /** Standard error of k: weights 1/SE(ln k)^2 with SE(ln k) = SE(k)/k, for a weighted fit. */
  standardError?: number;
}

export interface ArrheniusFit {
  Ea: Estimate;
  A: Estimate;
  line: LineFit;
}

export interface EyringFit {
  dH: Estimate;
  dS: Estimate;
  line: LineFit;
}

function lineOf(points: TemperaturePoint[], y: (p: TemperaturePoint) => number, weighted: boolean): LineFit {
  points.forEach((p, i) => {
    if (!(p.k > 0)) throw new EngineError('non-positive-rate', `point ${i} has k = ${p.k}`, `points[${i}].k`);
    if (!(p.temperature > 0)) throw new EngineError('not-above-absolute-zero', `point ${i} has T = ${p.temperature} K`, `points[${i}].temperature`);
  });
  if (points.length < 2) throw new EngineError('too-few-points', `a line against 1/T needs at least 2 temperatures, got ${points.length}`, 'points');
  if (points.length === 2) return lineThroughTwoPoints(points.map((p) => 1 / p.temperature), points.map(y));
  const sigma = weighted
    ? points.map((p, i) => {
        if (p.standardError === undefined) throw new EngineError('bad-weight', `point ${i} has no standard error for a weighted fit`, `points[${i}].standardError`);
        return p.standardError / p.k;
      })
    : undefined;
  return fitLine(points.map((p) => 1 / p.temperature), points.map(y), { sigma });
}

/** An estimate a x + b of the line's slope (or intercept), with its interval mapped the same way. */
function scaled(value: number, se: number, ci: [number, number], a: number, b: number, unit: string): Estimate {
  const ends = [a * ci[0] + b, a * ci[1] + b].sort((x, y) => x - y) as [number, number];
  return { value: a * value + b, standardError: Math.abs(a) * se, ci95: ends, unit };
}

export function fitArrhenius(points: TemperaturePoint[], options: { kUnit: string; weighted?: boolean }): ArrheniusFit {
  const line = lineOf(points, (p) => Math.log(p.k), options.weighted === true);
  const A = Math.exp(line.intercept);
  return {
    Ea: scaled(line.slope, line.seSlope, line.ci95.slope, -GAS_CONSTANT, 0, 'J mol^-1'),
    A: { value: A, standardError: A * line.seIntercept, ci95: [Math.exp(line.ci95.intercept[0]), Math.exp(line.ci95.intercept[1])], unit: options.kUnit },
    line,
  };
}

/** Eyring's fit: every k in s^-1. */
export function fitEyring(points: TemperaturePoint[], options: { weighted?: boolean } = {}): EyringFit {
  const line = lineOf(points, (p) => Math.log(p.k / p.temperature), options.weighted === true);
  return {
    dH: scaled(line.slope, line.seSlope, line.ci95.slope, -GAS_CONSTANT, 0, 'J mol^-1'),
    dS: scaled(line.intercept, line.seIntercept, line.ci95.intercept, GAS_CONSTANT, -GAS_CONSTANT * LN_KB_OVER_H, 'J K^-1 mol^-1'),
    line,
  };
}
