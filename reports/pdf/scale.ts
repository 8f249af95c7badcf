import { superscript } from '../format.ts';

/**
 * Axis ranges and ticks: a range padded and rounded out to steps of 1, 2, 2.5 or 5 times a power of ten.
 * Very small or large ranges are printed as multiples of a power of ten named in the axis label.
 */
export interface Axis {
  min: number;
  max: number;
  ticks: number[];
  /** Tick labels are tick / 10^power. */
  power: number;
  decimals: number;
}

export interface AxisOptions {
  includeZero?: boolean;
  /** Fraction of the range added on each side before rounding out. */
  pad?: number;
  ticks?: number;
}

export function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const mantissa = [1, 2, 2.5, 5, 10].find((m) => m * magnitude >= raw * 0.999) ?? 10;
  return mantissa * magnitude;
}

export function niceAxis(values: number[], options: AxisOptions = {}): Axis {
  const finite = values.filter(Number.isFinite);
  let low = finite.length ? Math.min(...finite) : 0;
  let high = finite.length ? Math.max(...finite) : 1;
  if (options.includeZero) {
    low = Math.min(low, 0);
    high = Math.max(high, 0);
  }
  if (high - low <= Math.abs(high) * 1e-9 || high === low) {
    const half = high === 0 ? 1 : Math.abs(high) * 0.1;
    low -= half;
    high += half;
  }
  const pad = (high - low) * (options.pad ?? 0.04);
  const padLow = options.includeZero && low === 0 ? 0 : pad;
  const padHigh = options.includeZero && high === 0 ? 0 : pad;
  const step = niceStep(high - low + padLow + padHigh, options.ticks ?? 5);
  // `+ 0` turns a -0 into 0.
  const min = Math.floor((low - padLow) / step + 1e-9) * step + 0;
  const max = Math.ceil((high + padHigh) / step - 1e-9) * step + 0;
  const ticks: number[] = [];
  for (let v = min; v <= max + step * 1e-6; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  const largest = Math.max(Math.abs(min), Math.abs(max));
  const power = largest > 0 && (largest < 0.01 || largest >= 1e4) ? Math.floor(Math.log10(largest)) : 0;
  const scaledStep = step / 10 ** power;
  const stepMantissa = scaledStep / 10 ** Math.floor(Math.log10(scaledStep) + 1e-9);
  const decimals = Math.max(0, -Math.floor(Math.log10(scaledStep) + 1e-9) + (Math.abs(stepMantissa - 2.5) < 1e-6 ? 1 : 0));
  return { min, max, ticks, power, decimals };
}

/** The tick's label, with the minus sign. */
export function tickLabel(axis: Axis, value: number): string {
  const text = (value / 10 ** axis.power).toFixed(axis.decimals);
  return text.replace(/^-/, '\u2212').replace(/^\u22120(\.0*)?$/, '0$1');
}

/** The axis label with the power the ticks are scaled by, e.g. `k_{obs} / min⁻¹ (×10⁻³)`. */
export function axisLabel(label: string, axis: Axis): string {
  return axis.power === 0 ? label : `${label}  (×10${superscript(String(axis.power))})`;
}

/**
 * The values an axis spans: the data's always, the student's only while within the data's span of
 * it, so that a value off by a factor of 60 does not flatten the data to a stripe.
 */
export function nearValues(data: number[], theirs: number[]): number[] {
  const finite = data.filter(Number.isFinite);
  const [low, high] = [Math.min(...finite), Math.max(...finite)];
  const span = high - low || 1;
  return [...finite, ...theirs.filter((y) => y > low - span && y < high + span)];
}
