/**
 * Typed errors of the numeric engine. Each carries a stable code, so the checker and the HTTP layer
 * can map it without parsing messages, and a `field` naming the offending input where there is one.
 */
export const engineErrorCodes = {
  'too-few-points': 'fewer points than the fit needs',
  'degenerate-x': 'all x values (times or concentrations) are equal, so no slope can be fitted',
  'non-finite': 'a value is not a finite number',
  'times-not-increasing': 'the times of a run go back',
  'non-positive-ratio': 'a reading lies on the wrong side of the end value, so ln F is undefined',
  'bad-weight': 'a weight or standard error is not positive',
  'unknown-unit': 'the unit is not recognised',
  'unit-kind-mismatch': 'the unit is of the wrong kind for this quantity',
  'no-convergence': 'the iterative fit did not converge',
  'no-interval-pairs': 'too few pairs of readings a constant interval apart',
  'not-above-absolute-zero': 'a temperature at or below absolute zero',
  'non-positive-rate': 'a rate constant that is not positive has no logarithm',
} as const;

export type EngineErrorCode = keyof typeof engineErrorCodes;

export class EngineError extends Error {
  override readonly name = 'EngineError';
  constructor(
    readonly code: EngineErrorCode,
    message: string,
    /** Where in the input the problem is, e.g. `readings[4]` or `unit`. */
    readonly field?: string,
  ) {
    super(message);
  }
}

export function requireFinite(values: ArrayLike<number>, field: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new EngineError('non-finite', `${field}[${i}] is ${String(values[i])}, not a finite number`, `${field}[${i}]`);
    }
  }
}
