import { EngineError } from './engine-error.ts';

/**
 * A temperature in kelvin. Celsius is an offset from kelvin, which the multiplying unit grammar cannot
 * say, so temperatures have this reader of their own. `C` alone is refused: it is the coulomb.
 */
const CELSIUS = new Set(['degC', '°C', 'deg C', 'celsius', 'Celsius']);
// 0 degC = 273.15 K by the definition of the Celsius scale.
export const ZERO_CELSIUS_K = 273.15;

export function toKelvin(value: number, unit: string, field = 'temperature'): number {
  const text = unit.trim();
  let kelvin: number;
  if (text === 'K') kelvin = value;
  else if (CELSIUS.has(text)) kelvin = value + ZERO_CELSIUS_K;
  else throw new EngineError('unknown-unit', `"${unit}" is not a temperature unit; use K or degC`, field);
  if (!(kelvin > 0) || !Number.isFinite(kelvin)) throw new EngineError('not-above-absolute-zero', `${value} ${text} is not above absolute zero`, field);
  return kelvin;
}
